// Small-signal AC nodal analysis of a harness netlist (modified nodal analysis reduced to plain
// nodal analysis; standard circuit theory). Unknowns are the node voltages (ground excluded); the
// transfer is V(out) per volt of pickup EMF, in double precision, with no approximation.
//
// Matrix: at angular frequency ω the nodal matrix is A = G + jω·Cm + Γ/(jω) = G + j(ω·Cm − Γ/ω),
// with G, Cm (capacitances) and Γ (inverse inductances) real and stamped once per netlist. Pots
// change G alone, so a knob setting only adds its pot conductances.
//
// Pickup source: the EMF E in series with R and L is replaced by its exact Norton equivalent, a
// current E·y into the hot node (out of the cold node) with the admittance y = 1/(R + jωL) across
// the terminals (Thevenin–Norton equivalence, standard circuit theory). This eliminates the coil's
// internal node. The SPICE export keeps the source, R and L as separate elements, so the ngspice
// check also checks this step.
//
// Elimination: the output node is numbered last, so after forward elimination V(out) is b/A of
// the last row, with no back substitution. Two paths:
//  - the fast path, used when every node reaches ground through parts that conduct at all
//    frequencies (resistors, pot halves, the pickup: Re 1/(R + jωL) > 0). Then Re A = G_total is
//    symmetric positive definite, and A is complex symmetric (a reciprocal network). Eliminating a
//    node is Kron reduction to the equivalent network of the remaining nodes, which keeps both
//    properties, so every pivot has a positive real part and no pivoting is needed (G. H. Golub and C. F. Van
//    Loan, "Unsymmetric positive definite linear systems", Linear Algebra Appl. 28, 1979 — cited
//    from memory). The agreement with ngspice and with the pivoting path is checked in the tests. The
//    order is chosen once (minimum degree, output last), the elimination is worked out
//    symbolically into a program over the upper triangle only (A symmetric), and each knob setting
//    replays it over all frequencies at once: every step is a tight loop over frequencies on
//    preallocated Float64Arrays (real and imaginary parts apart), with no allocation. The parts
//    that do not move with a knob (fixed conductances, ω·Cm − Γ/ω, the pickup's y and current) are
//    built once per frequency list and copied in per setting.
//  - dense Gaussian elimination with partial pivoting, for netlists without that property, for a
//    frequency whose pivot would not have a positive real part (a check that should never fire),
//    and for tests.
import { GROUND, knobSetting, OUTPUT, potHalves, validateNetlist, type Knobs, type Netlist, type Part, type PotPart } from './netlist';

interface CompiledPot {
  pot: PotPart;
  ia: number;
  ib: number; // −1 for ground, −2 when the pot has no b end connected
  iw: number;
}

interface CompiledSource {
  ih: number;
  ic: number;
  R: number;
  L: number;
  emf: number;
  /** index of the source's group (pickup) in CompiledHarness.groups */
  g: number;
}

/** Scratch of the fast path for up to `stride` frequencies. Entry e of slot s is at s·stride + e. */
interface BatchScratch {
  stride: number;
  /** how many frequencies are prepared */
  m: number;
  f: Float64Array;
  w: Float64Array;
  iw: Float64Array;
  /** knob-independent part of the system, per frequency */
  are0: Float64Array;
  aim0: Float64Array;
  bre0: Float64Array;
  bim0: Float64Array;
  /** working copies, eliminated in place; right-hand side of group g, node i at (g·n + i)·stride */
  are: Float64Array;
  aim: Float64Array;
  bre: Float64Array;
  bim: Float64Array;
  /** inverse pivot and row multiplier, per frequency */
  pr: Float64Array;
  pi: Float64Array;
  mr: Float64Array;
  mi: Float64Array;
  bad: Uint8Array;
}

/**
 * The circuit has no unique solution at some frequency: a node (or a group of nodes) has no path
 * to the rest of the circuit there, e.g. a part connected only through a capacitor to a node that
 * floats. The API answers it as a 422 in words; the message never reaches a user as it is.
 */
export class HarnessUnsolvableError extends Error {
  constructor() {
    super(
      'The circuit cannot be solved: some node has no connection to ground at one of the frequencies (check that every part is wired at both ends).',
    );
    this.name = 'HarnessUnsolvableError';
  }
}

export interface CompiledHarness {
  readonly netlist: Netlist;
  /** Node names by matrix index; the output node is last. */
  readonly nodeNames: readonly string[];
  readonly size: number;
  /** True when the fast path (fixed order, no pivoting) applies: every node conducts to ground. */
  readonly staticOrder: boolean;
  /** @internal dense stamps: fixed conductance, conductance with the pots, capacitance, inverse inductance */
  readonly g0: Float64Array;
  readonly g: Float64Array;
  readonly cap: Float64Array;
  readonly invL: Float64Array;
  readonly pots: readonly CompiledPot[];
  readonly sources: readonly CompiledSource[];
  /**
   * The sources (pickups and coils) by part id, in netlist order. The system is solved for each
   * source alone (one right-hand side each, superposition) and the transfer is their sum.
   */
  readonly groups: readonly string[];
  /** The pickup each source belongs to (its `group`, else its own id), by source index. */
  readonly pickupOf: readonly string[];
  /** @internal resistors and capacitors by part id, for setPartValue: node indices and the stamped value */
  readonly fixedParts: Map<string, { kind: 'resistor' | 'capacitor'; ia: number; ib: number; value: number }>;
  /** @internal dense scratch of the pivoting path (right-hand side of group g, node i at g·n + i) */
  readonly are: Float64Array;
  readonly aim: Float64Array;
  readonly bre: Float64Array;
  readonly bim: Float64Array;
  /** @internal slot of entry (i, j) of the upper triangle (i ≤ j; −1: structural zero), fill-in included */
  readonly upper: Int32Array;
  readonly slots: number;
  /** @internal per step [kk, k, rows, per row [ki, i, cols, per col [ij, kj]]], in slots and node indices */
  readonly program: Int32Array;
  /** @internal slots the pots touch, and per pot half its terms [half, slot list index, sign] */
  readonly potSlots: Int32Array;
  readonly potTerms: Int32Array;
  readonly potG: Float64Array;
  readonly potDelta: Float64Array;
  /** @internal fast-path scratch for frequency lists, and for single frequencies */
  batch: BatchScratch | null;
  readonly point: BatchScratch;
  /** @internal the dial setting of each pot the conductances were stamped for */
  readonly potSetting: Float64Array;
  /** Result of the last solvePoint: V(out), real and imaginary (the sum over the groups). */
  hRe: number;
  hIm: number;
  /** Result of the last solvePoint per group: V(out) with only that group's sources. */
  readonly hgRe: Float64Array;
  readonly hgIm: Float64Array;
}

/** Per-group output arrays for solvePrepared: re[g], im[g], each as long as the frequency list. */
export interface GroupCurves {
  re: Float64Array[];
  im: Float64Array[];
}

function stampReal(m: Float64Array, n: number, i: number, j: number, v: number): void {
  if (i >= 0) m[i * n + i]! += v;
  if (j >= 0) m[j * n + j]! += v;
  if (i >= 0 && j >= 0) {
    m[i * n + j]! -= v;
    m[j * n + i]! -= v;
  }
}

/** The node pairs a part connects (each pair gets off-diagonal entries). */
function partEdges(p: Part): [string, string][] {
  switch (p.kind) {
    case 'pickup':
      return [[p.hot, p.cold]];
    case 'pot':
      return p.b === undefined
        ? [[p.a, p.w]]
        : [
            [p.a, p.w],
            [p.w, p.b],
          ];
    default:
      return [[p.a, p.b]];
  }
}

function newScratch(stride: number, slots: number, n: number, ng: number): BatchScratch {
  return {
    stride,
    m: 0,
    f: new Float64Array(stride),
    w: new Float64Array(stride),
    iw: new Float64Array(stride),
    are0: new Float64Array(slots * stride),
    aim0: new Float64Array(slots * stride),
    bre0: new Float64Array(ng * n * stride),
    bim0: new Float64Array(ng * n * stride),
    are: new Float64Array(slots * stride),
    aim: new Float64Array(slots * stride),
    bre: new Float64Array(ng * n * stride),
    bim: new Float64Array(ng * n * stride),
    pr: new Float64Array(stride),
    pi: new Float64Array(stride),
    mr: new Float64Array(stride),
    mi: new Float64Array(stride),
    bad: new Uint8Array(stride),
  };
}

/** Numbers the nodes, stamps every part that does not move with a knob and plans the elimination. */
export function compileHarness(netlist: Netlist): CompiledHarness {
  const problems = validateNetlist(netlist);
  if (problems.length > 0) throw new Error(`invalid harness netlist: ${problems.join('; ')}`);

  const adjacency = new Map<string, Set<string>>();
  const conductive = new Map<string, Set<string>>();
  const link = (graph: Map<string, Set<string>>, a: string, b: string) => {
    if (!graph.has(a)) graph.set(a, new Set());
    if (!graph.has(b)) graph.set(b, new Set());
    if (a !== b) {
      graph.get(a)!.add(b);
      graph.get(b)!.add(a);
    }
  };
  for (const p of netlist.parts) {
    for (const [a, b] of partEdges(p)) {
      link(adjacency, a, b);
      if (p.kind !== 'capacitor' && p.kind !== 'inductor') link(conductive, a, b);
    }
  }
  const reached = new Set<string>([GROUND]);
  const queue = [GROUND];
  while (queue.length > 0) {
    for (const next of conductive.get(queue.pop()!) ?? []) {
      if (!reached.has(next)) {
        reached.add(next);
        queue.push(next);
      }
    }
  }

  // Elimination order: greedy minimum degree over the other nodes (least fill-in), output last.
  const graph = new Map<string, Set<string>>();
  for (const [node, nbrs] of adjacency) {
    if (node !== GROUND) graph.set(node, new Set([...nbrs].filter((x) => x !== GROUND)));
  }
  const names: string[] = [];
  while (graph.size > 1) {
    let best = '';
    let bestDegree = Infinity;
    for (const [node, nbrs] of graph) {
      if (node !== OUTPUT && nbrs.size < bestDegree) {
        best = node;
        bestDegree = nbrs.size;
      }
    }
    const nbrs = [...graph.get(best)!];
    for (const a of nbrs) {
      const set = graph.get(a)!;
      set.delete(best);
      for (const b of nbrs) if (a !== b) set.add(b);
    }
    graph.delete(best);
    names.push(best);
  }
  names.push(OUTPUT);
  const n = names.length;
  const index = new Map(names.map((name, i) => [name, i] as const));
  const idx = (node: string): number => (node === GROUND ? -1 : index.get(node)!);

  const g0 = new Float64Array(n * n);
  const cap = new Float64Array(n * n);
  const invL = new Float64Array(n * n);
  const pots: CompiledPot[] = [];
  const sources: CompiledSource[] = [];
  const groups: string[] = [];
  const pickupOf: string[] = [];
  const fixedParts: CompiledHarness['fixedParts'] = new Map();
  for (const p of netlist.parts) {
    switch (p.kind) {
      case 'resistor':
        stampReal(g0, n, idx(p.a), idx(p.b), 1 / p.R);
        fixedParts.set(p.id, { kind: 'resistor', ia: idx(p.a), ib: idx(p.b), value: p.R });
        break;
      case 'capacitor':
        stampReal(cap, n, idx(p.a), idx(p.b), p.C);
        fixedParts.set(p.id, { kind: 'capacitor', ia: idx(p.a), ib: idx(p.b), value: p.C });
        break;
      case 'inductor':
        stampReal(invL, n, idx(p.a), idx(p.b), 1 / p.L);
        break;
      case 'pot':
        pots.push({ pot: p, ia: idx(p.a), ib: p.b === undefined ? -2 : idx(p.b), iw: idx(p.w) });
        break;
      case 'pickup':
        stampReal(cap, n, idx(p.hot), idx(p.cold), p.C);
        if (p.Rp !== undefined) stampReal(g0, n, idx(p.hot), idx(p.cold), 1 / p.Rp);
        {
          const g = groups.push(p.id) - 1;
          pickupOf.push(p.group ?? p.id);
          sources.push({ ih: idx(p.hot), ic: idx(p.cold), R: p.R, L: p.L, emf: p.emf ?? 1, g });
        }
        break;
    }
  }

  // Symbolic elimination: the pattern with its fill-in, the upper-triangle slots, the program.
  const pattern: boolean[] = Array.from({ length: n * n }, (_, k) => k % (n + 1) === 0);
  for (const p of netlist.parts) {
    for (const [a, b] of partEdges(p)) {
      const i = idx(a);
      const j = idx(b);
      if (i >= 0 && j >= 0) pattern[i * n + j] = pattern[j * n + i] = true;
    }
  }
  const rowsOf: number[][] = [];
  for (let k = 0; k < n - 1; k++) {
    const rows: number[] = [];
    for (let i = k + 1; i < n; i++) if (pattern[k * n + i]) rows.push(i);
    for (const i of rows) for (const j of rows) pattern[i * n + j] = true;
    rowsOf.push(rows);
  }
  const upper = new Int32Array(n * n).fill(-1);
  let slots = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      if (pattern[i * n + j]) upper[i * n + j] = upper[j * n + i] = slots++;
    }
  }
  const program: number[] = [];
  rowsOf.forEach((rows, k) => {
    program.push(upper[k * n + k]!, k, rows.length);
    for (const i of rows) {
      const cols = rows.filter((j) => j >= i);
      program.push(upper[k * n + i]!, i, cols.length);
      for (const j of cols) program.push(upper[i * n + j]!, upper[k * n + j]!);
    }
  });

  // Where each pot half's conductance goes (upper triangle): +g on both diagonals, −g between.
  const potSlotList: number[] = [];
  const potTerms: number[] = [];
  let half = 0;
  const addTerm = (i: number, j: number, sign: number) => {
    const s = upper[i * n + j]!;
    let li = potSlotList.indexOf(s);
    if (li < 0) li = potSlotList.push(s) - 1;
    potTerms.push(half, li, sign);
  };
  for (const cp of pots) {
    const halves: [number, number][] = [[cp.ia, cp.iw]];
    if (cp.ib !== -2) halves.push([cp.iw, cp.ib]);
    for (const [i, j] of halves) {
      if (i >= 0) addTerm(i, i, 1);
      if (j >= 0) addTerm(j, j, 1);
      if (i >= 0 && j >= 0 && i !== j) addTerm(Math.min(i, j), Math.max(i, j), -1);
      half++;
    }
  }

  return {
    netlist,
    nodeNames: names,
    size: n,
    staticOrder: names.every((x) => reached.has(x)),
    g0,
    g: new Float64Array(n * n),
    cap,
    invL,
    pots,
    sources,
    groups,
    pickupOf,
    fixedParts,
    are: new Float64Array(n * n),
    aim: new Float64Array(n * n),
    bre: new Float64Array(groups.length * n),
    bim: new Float64Array(groups.length * n),
    upper,
    slots,
    program: Int32Array.from(program),
    potSlots: Int32Array.from(potSlotList),
    potTerms: Int32Array.from(potTerms),
    potG: new Float64Array(half),
    potDelta: new Float64Array(potSlotList.length),
    batch: null,
    point: newScratch(1, slots, n, groups.length),
    potSetting: new Float64Array(pots.length).fill(Number.NaN),
    hRe: 0,
    hIm: 0,
    hgRe: new Float64Array(groups.length),
    hgIm: new Float64Array(groups.length),
  };
}

/** Stamps the pot conductances for a knob setting (skipped when the setting has not changed). */
export function setKnobs(c: CompiledHarness, knobs: Knobs): void {
  let same = true;
  for (let i = 0; i < c.pots.length && same; i++) same = c.potSetting[i] === knobSetting(c.pots[i]!.pot.knob, knobs);
  if (same) return;
  const n = c.size;
  c.g.set(c.g0);
  let h = 0;
  for (const cp of c.pots) {
    const { aw, wb } = potHalves(cp.pot, knobs);
    stampReal(c.g, n, cp.ia, cp.iw, 1 / aw);
    c.potG[h++] = 1 / aw;
    if (cp.ib !== -2) {
      stampReal(c.g, n, cp.iw, cp.ib, 1 / wb);
      c.potG[h++] = 1 / wb;
    }
  }
  c.potDelta.fill(0);
  const t = c.potTerms;
  for (let q = 0; q < t.length; q += 3) c.potDelta[t[q + 1]!]! += t[q + 2]! * c.potG[t[q]!]!;
  for (let i = 0; i < c.pots.length; i++) c.potSetting[i] = knobSetting(c.pots[i]!.pot.knob, knobs);
}

/** Builds the knob-independent part of the system for the frequencies in B.f[0..m). */
function prepareScratch(c: CompiledHarness, B: BatchScratch, m: number): void {
  const S = B.stride;
  const n = c.size;
  const { f, w, iw, are0, aim0, bre0, bim0 } = B;
  for (let k = 0; k < m; k++) {
    w[k] = 2 * Math.PI * f[k]!;
    iw[k] = 1 / w[k]!;
  }
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const s = c.upper[i * n + j]!;
      if (s < 0) continue;
      const gv = c.g0[i * n + j]!;
      const cv = c.cap[i * n + j]!;
      const lv = c.invL[i * n + j]!;
      const base = s * S;
      are0.fill(gv, base, base + m);
      for (let k = 0; k < m; k++) aim0[base + k] = w[k]! * cv - iw[k]! * lv;
    }
  }
  bre0.fill(0);
  bim0.fill(0);
  for (const src of c.sources) {
    const go = src.g * n * S;
    const hh = src.ih >= 0 ? c.upper[src.ih * n + src.ih]! * S : -1;
    const cc = src.ic >= 0 ? c.upper[src.ic * n + src.ic]! * S : -1;
    const hc = src.ih >= 0 && src.ic >= 0 ? c.upper[src.ih * n + src.ic]! * S : -1;
    for (let k = 0; k < m; k++) {
      // y = 1/(R + jωL) = (R − jωL)/(R² + ω²L²)
      const x = w[k]! * src.L;
      const d = src.R * src.R + x * x;
      const yr = src.R / d;
      const yi = -x / d;
      if (hh >= 0) {
        are0[hh + k]! += yr;
        aim0[hh + k]! += yi;
        bre0[go + src.ih * S + k]! += src.emf * yr;
        bim0[go + src.ih * S + k]! += src.emf * yi;
      }
      if (cc >= 0) {
        are0[cc + k]! += yr;
        aim0[cc + k]! += yi;
        bre0[go + src.ic * S + k]! -= src.emf * yr;
        bim0[go + src.ic * S + k]! -= src.emf * yi;
      }
      if (hc >= 0) {
        are0[hc + k]! -= yr;
        aim0[hc + k]! -= yi;
      }
    }
  }
  B.m = m;
}

/**
 * Fast path: replays the elimination program over the prepared frequencies for the knob setting
 * last stamped, writing V(out) (the sum over the groups) into outRe/outIm from `offset`, and each
 * group's own V(out) into `groupOut` when given.
 */
function eliminateScratch(
  c: CompiledHarness,
  B: BatchScratch,
  outRe: Float64Array,
  outIm: Float64Array,
  offset: number,
  groupOut?: GroupCurves,
): void {
  const S = B.stride;
  const m = B.m;
  const n = c.size;
  const gStep = n * S;
  const gEnd = c.groups.length * gStep;
  const { are, aim, bre, bim, pr, pi, mr, mi, bad } = B;
  const are0 = B.are0;
  are.set(are0);
  aim.set(B.aim0);
  bre.set(B.bre0);
  bim.set(B.bim0);
  const { potSlots, potDelta, program } = c;
  for (let q = 0; q < potSlots.length; q++) {
    const d = potDelta[q]!;
    const base = potSlots[q]! * S;
    for (let k = base; k < base + m; k++) are[k] = are0[k]! + d;
  }
  bad.fill(0, 0, m);

  let p = 0;
  const end = program.length;
  while (p < end) {
    const kk = program[p++]! * S;
    const kb = program[p++]! * S;
    const rows = program[p++]!;
    for (let r = 0; r < rows; r++) {
      const ki = program[p++]! * S;
      const ib = program[p++]! * S;
      const cols = program[p++]!;
      if (r === 0) {
        // First row: the pivot's inverse is computed here, and kept for the other rows.
        for (let k = 0; k < m; k++) {
          const ar = are[kk + k]!;
          const ai = aim[kk + k]!;
          // Re(pivot) > 0 always holds on this path (see the header); the check is a safety net.
          if (!(ar > 0)) bad[k] = 1;
          const inv = 1 / (ar * ar + ai * ai);
          pr[k] = ar * inv;
          pi[k] = -ai * inv;
        }
      }
      for (let k = 0; k < m; k++) {
        // multiplier A_ik / A_kk, with A_ik = A_ki (symmetric)
        const fr = are[ki + k]!;
        const fi = aim[ki + k]!;
        const qr = pr[k]!;
        const qi = pi[k]!;
        mr[k] = fr * qr - fi * qi;
        mi[k] = fr * qi + fi * qr;
      }
      for (let go = 0; go < gEnd; go += gStep) {
        const bk = go + kb;
        const bi0 = go + ib;
        for (let k = 0; k < m; k++) {
          const xr = mr[k]!;
          const xi = mi[k]!;
          const br = bre[bk + k]!;
          const bi = bim[bk + k]!;
          bre[bi0 + k]! -= xr * br - xi * bi;
          bim[bi0 + k]! -= xr * bi + xi * br;
        }
      }
      for (let q = 0; q < cols; q++) {
        const ij = program[p++]! * S;
        const kj = program[p++]! * S;
        for (let k = 0; k < m; k++) {
          const xr = mr[k]!;
          const xi = mi[k]!;
          const ur = are[kj + k]!;
          const ui = aim[kj + k]!;
          are[ij + k]! -= xr * ur - xi * ui;
          aim[ij + k]! -= xr * ui + xi * ur;
        }
      }
    }
  }
  const last = c.upper[n * n - 1]! * S;
  const ob = (n - 1) * S;
  const ng = c.groups.length;
  for (let k = 0; k < m; k++) {
    const r = are[last + k]!;
    const i = aim[last + k]!;
    if (bad[k] === 0 && r > 0) {
      const inv = 1 / (r * r + i * i);
      let sr = 0;
      let si = 0;
      for (let g = 0; g < ng; g++) {
        const br = bre[g * gStep + ob + k]!;
        const bi = bim[g * gStep + ob + k]!;
        const vr = (br * r + bi * i) * inv;
        const vi = (bi * r - br * i) * inv;
        sr += vr;
        si += vi;
        if (groupOut) {
          groupOut.re[g]![offset + k] = vr;
          groupOut.im[g]![offset + k] = vi;
        }
      }
      outRe[offset + k] = sr;
      outIm[offset + k] = si;
    } else {
      solvePivoting(c, B.w[k]!);
      outRe[offset + k] = c.hRe;
      outIm[offset + k] = c.hIm;
      if (groupOut) {
        for (let g = 0; g < ng; g++) {
          groupOut.re[g]![offset + k] = c.hgRe[g]!;
          groupOut.im[g]![offset + k] = c.hgIm[g]!;
        }
      }
    }
  }
}

/** Dense Gaussian elimination with partial pivoting (pivot chosen by |re| + |im|); result in hRe/hIm. */
function solvePivoting(c: CompiledHarness, w: number): void {
  const n = c.size;
  const nn = n * n;
  const { g, cap, invL, are, aim, bre, bim } = c;
  const iw = 1 / w;
  for (let i = 0; i < nn; i++) {
    are[i] = g[i]!;
    aim[i] = w * cap[i]! - iw * invL[i]!;
  }
  const ng = c.groups.length;
  bre.fill(0);
  bim.fill(0);
  for (const src of c.sources) {
    const go = src.g * n;
    const x = w * src.L;
    const d = src.R * src.R + x * x;
    const yr = src.R / d;
    const yi = -x / d;
    const h = src.ih;
    const q = src.ic;
    if (h >= 0) {
      are[h * n + h]! += yr;
      aim[h * n + h]! += yi;
      bre[go + h]! += src.emf * yr;
      bim[go + h]! += src.emf * yi;
    }
    if (q >= 0) {
      are[q * n + q]! += yr;
      aim[q * n + q]! += yi;
      bre[go + q]! -= src.emf * yr;
      bim[go + q]! -= src.emf * yi;
    }
    if (h >= 0 && q >= 0) {
      are[h * n + q]! -= yr;
      aim[h * n + q]! -= yi;
      are[q * n + h]! -= yr;
      aim[q * n + h]! -= yi;
    }
  }
  for (let k = 0; k < n - 1; k++) {
    const kk = k * n + k;
    let p = k;
    let best = Math.abs(are[kk]!) + Math.abs(aim[kk]!);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(are[i * n + k]!) + Math.abs(aim[i * n + k]!);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (best === 0) throw new HarnessUnsolvableError();
    if (p !== k) {
      for (let j = k; j < n; j++) {
        const a = k * n + j;
        const b = p * n + j;
        let t = are[a]!;
        are[a] = are[b]!;
        are[b] = t;
        t = aim[a]!;
        aim[a] = aim[b]!;
        aim[b] = t;
      }
      for (let go = 0; go < ng * n; go += n) {
        let t = bre[go + k]!;
        bre[go + k] = bre[go + p]!;
        bre[go + p] = t;
        t = bim[go + k]!;
        bim[go + k] = bim[go + p]!;
        bim[go + p] = t;
      }
    }
    const pr = are[kk]!;
    const pi = aim[kk]!;
    const pd = pr * pr + pi * pi;
    const ir = pr / pd;
    const ii = -pi / pd;
    for (let i = k + 1; i < n; i++) {
      const ik = i * n + k;
      const fr = are[ik]!;
      const fi = aim[ik]!;
      if (fr === 0 && fi === 0) continue;
      const xr = fr * ir - fi * ii;
      const xi = fr * ii + fi * ir;
      for (let j = k + 1; j < n; j++) {
        const ur = are[k * n + j]!;
        const ui = aim[k * n + j]!;
        are[i * n + j]! -= xr * ur - xi * ui;
        aim[i * n + j]! -= xr * ui + xi * ur;
      }
      for (let go = 0; go < ng * n; go += n) {
        const brk = bre[go + k]!;
        const bik = bim[go + k]!;
        bre[go + i]! -= xr * brk - xi * bik;
        bim[go + i]! -= xr * bik + xi * brk;
      }
    }
  }
  const last = nn - 1;
  const pr = are[last]!;
  const pi = aim[last]!;
  const pd = pr * pr + pi * pi;
  if (!(pd > 0)) throw new HarnessUnsolvableError();
  let sr = 0;
  let si = 0;
  for (let g = 0; g < ng; g++) {
    const br = bre[g * n + n - 1]!;
    const bi = bim[g * n + n - 1]!;
    const vr = (br * pr + bi * pi) / pd;
    const vi = (bi * pr - br * pi) / pd;
    c.hgRe[g] = vr;
    c.hgIm[g] = vi;
    sr += vr;
    si += vi;
  }
  c.hRe = sr;
  c.hIm = si;
}

const pointRe = new Float64Array(1);
const pointIm = new Float64Array(1);
const pointGroups = new WeakMap<CompiledHarness, GroupCurves>();

function pointGroupsOf(c: CompiledHarness): GroupCurves {
  let g = pointGroups.get(c);
  if (!g) {
    g = { re: c.groups.map(() => new Float64Array(1)), im: c.groups.map(() => new Float64Array(1)) };
    pointGroups.set(c, g);
  }
  return g;
}

/**
 * Solves the network at one frequency (Hz) for the knob setting last given to setKnobs, leaving
 * V(out) in c.hRe / c.hIm. Allocates nothing. `method` 'pivoting' forces the dense
 * partial-pivoting path (for tests).
 */
export function solvePoint(c: CompiledHarness, frequency: number, method: 'auto' | 'pivoting' = 'auto'): void {
  if (method === 'pivoting' || !c.staticOrder) {
    solvePivoting(c, 2 * Math.PI * frequency);
    return;
  }
  c.point.f[0] = frequency;
  prepareScratch(c, c.point, 1);
  if (c.groups.length === 1) {
    eliminateScratch(c, c.point, pointRe, pointIm, 0);
    c.hgRe[0] = pointRe[0]!;
    c.hgIm[0] = pointIm[0]!;
  } else {
    const g = pointGroupsOf(c);
    eliminateScratch(c, c.point, pointRe, pointIm, 0, g);
    for (let i = 0; i < c.groups.length; i++) {
      c.hgRe[i] = g.re[i]![0]!;
      c.hgIm[i] = g.im[i]![0]!;
    }
  }
  c.hRe = pointRe[0]!;
  c.hIm = pointIm[0]!;
}

/**
 * Loads a frequency list (Hz) for solvePrepared: ω, 1/ω and the knob-independent part of the
 * system per frequency, shared by every knob setting solved next.
 */
export function prepareFrequencies(c: CompiledHarness, frequencies: ArrayLike<number>): void {
  const m = frequencies.length;
  if (c.batch === null || c.batch.stride < m) c.batch = newScratch(Math.max(m, 1), c.slots, c.size, c.groups.length);
  const B = c.batch;
  if (B.m === m) {
    // Same list as last time (the usual case while a knob is dragged): nothing to rebuild.
    let same = true;
    for (let k = 0; k < m && same; k++) same = B.f[k] === frequencies[k];
    if (same) return;
  }
  for (let k = 0; k < m; k++) B.f[k] = frequencies[k]!;
  prepareScratch(c, B, m);
}

/**
 * Solves every prepared frequency at the knob setting last given to setKnobs, writing V(out) into
 * outRe/outIm from `offset`. Allocates nothing.
 */
export function solvePrepared(c: CompiledHarness, outRe: Float64Array, outIm: Float64Array, offset = 0, groupOut?: GroupCurves): void {
  const B = c.batch;
  if (B === null) throw new Error('solvePrepared: call prepareFrequencies first');
  if (!c.staticOrder) {
    for (let k = 0; k < B.m; k++) {
      solvePivoting(c, B.w[k]!);
      outRe[offset + k] = c.hRe;
      outIm[offset + k] = c.hIm;
      if (groupOut) {
        for (let g = 0; g < c.groups.length; g++) {
          groupOut.re[g]![offset + k] = c.hgRe[g]!;
          groupOut.im[g]![offset + k] = c.hgIm[g]!;
        }
      }
    }
    return;
  }
  eliminateScratch(c, B, outRe, outIm, offset, groupOut);
}

export interface ComplexCurve {
  re: Float64Array;
  im: Float64Array;
}

/**
 * The transfer V(out)/E at each frequency (Hz) for one knob setting. Pass `out` to reuse arrays
 * (each at least frequencies.length long) and avoid allocation.
 */
export function solve(compiled: CompiledHarness, knobs: Knobs, frequencies: ArrayLike<number>, out?: ComplexCurve): ComplexCurve {
  const m = frequencies.length;
  const res = out ?? { re: new Float64Array(m), im: new Float64Array(m) };
  if (res.re.length < m || res.im.length < m) throw new Error('solve: output arrays are shorter than the frequency list');
  setKnobs(compiled, knobs);
  prepareFrequencies(compiled, frequencies);
  solvePrepared(compiled, res.re, res.im);
  return res;
}

/**
 * The transfer and each source's own transfer (the other sources silent) at one knob setting:
 * `total` is the sum of `groups[g]` (superposition; a reversed source enters with its negative EMF).
 */
export function solveGroups(
  compiled: CompiledHarness,
  knobs: Knobs,
  frequencies: ArrayLike<number>,
): { total: ComplexCurve; groups: ComplexCurve[] } {
  const m = frequencies.length;
  const total = { re: new Float64Array(m), im: new Float64Array(m) };
  const out: GroupCurves = { re: compiled.groups.map(() => new Float64Array(m)), im: compiled.groups.map(() => new Float64Array(m)) };
  setKnobs(compiled, knobs);
  prepareFrequencies(compiled, frequencies);
  solvePrepared(compiled, total.re, total.im, 0, out);
  return { total, groups: out.re.map((re, g) => ({ re, im: out.im[g]! })) };
}

/**
 * Changes the value of a resistor (Ω) or capacitor (F) of a compiled harness in place, without
 * compiling again (the structure is unchanged; used by the treble-bleed finder). The next solve
 * rebuilds the knob-independent part of the system.
 */
export function setPartValue(c: CompiledHarness, partId: string, value: number): void {
  const part = c.fixedParts.get(partId);
  if (!part) throw new Error(`setPartValue: no resistor or capacitor "${partId}"`);
  if (!(Number.isFinite(value) && value > 0)) throw new Error(`setPartValue: ${partId} must be positive (got ${value})`);
  if (part.value === value) return;
  const n = c.size;
  if (part.kind === 'resistor') {
    stampReal(c.g0, n, part.ia, part.ib, 1 / value - 1 / part.value);
    c.potSetting.fill(Number.NaN); // g = g0 + pots is stamped again on the next setKnobs
  } else {
    stampReal(c.cap, n, part.ia, part.ib, value - part.value);
  }
  part.value = value;
  if (c.batch) c.batch.m = -1;
  c.point.m = -1;
}
