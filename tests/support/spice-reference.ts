// A small, independent AC solver for plain SPICE netlists (R, C, L and AC voltage sources only),
// written for the tests: modified nodal analysis as in any circuits text (node voltages plus one
// branch current per voltage source and per inductor; C.-W. Ho, A. E. Ruehli and P. A. Brennan,
// "The modified nodal approach to network analysis", IEEE Trans. Circuits Syst. 22, 1975 — cited
// from memory), solved densely with complex Gaussian elimination and partial pivoting. It shares
// no code with shared/circuit: it reads the hand-written netlists of hand-netlists.ts so the
// engine can be checked against them without starting ngspice (the mutation runs), and the
// ngspice test checks this solver against ngspice on the same text.

export interface SpiceElement {
  kind: 'R' | 'C' | 'L' | 'V';
  name: string;
  a: string;
  b: string;
  value: number;
  /** a source's AC phase in degrees (`AC 1 180`: a reversed source); 0 when not written */
  phaseDeg: number;
}

const SCALE: Record<string, number> = { t: 1e12, g: 1e9, meg: 1e6, k: 1e3, m: 1e-3, u: 1e-6, n: 1e-9, p: 1e-12, f: 1e-15 };

/**
 * A SPICE number: plain or e-notation, optionally with a scale suffix (T, G, MEG, K, M = milli, U,
 * N, P, F, case-insensitive; letters after it ignored, as SPICE3 reads `22nF` or `1Meg`).
 */
export function spiceNumber(text: string): number {
  const m = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)(meg|[tgkmunpf])?[a-z]*$/i.exec(text);
  if (!m) return NaN;
  return Number(m[1]) * (m[2] ? SCALE[m[2].toLowerCase()]! : 1);
}

/**
 * Reads element lines `Rname a b value` (value in plain or e-notation, or with a scale suffix); V lines `Vname a b DC 0 AC v`
 * or `… AC v phase` (phase in degrees, as SPICE3 writes an AC source's phase).
 */
export function parseSpice(text: string): SpiceElement[] {
  const out: SpiceElement[] = [];
  // SPICE reads the first line as the title, whatever it holds
  for (const raw of text.split('\n').slice(1)) {
    const line = raw.trim();
    if (line === '' || line.startsWith('*') || line.startsWith('.')) continue;
    const kind = line[0]!.toUpperCase();
    if (kind !== 'R' && kind !== 'C' && kind !== 'L' && kind !== 'V') throw new Error(`spice-reference: no element "${line}"`);
    const f = line.split(/\s+/);
    if (f.length < 4) throw new Error(`spice-reference: cannot read "${line}"`);
    const ac = f.indexOf('AC');
    const value = spiceNumber((kind === 'V' ? f[ac + 1] : f[3]) ?? '');
    const phaseDeg = kind === 'V' && f[ac + 2] !== undefined ? spiceNumber(f[ac + 2]!) : 0;
    if (!Number.isFinite(value) || !Number.isFinite(phaseDeg)) throw new Error(`spice-reference: cannot read "${line}"`);
    out.push({ kind, name: f[0]!, a: f[1]!.toLowerCase(), b: f[2]!.toLowerCase(), value, phaseDeg });
  }
  return out;
}

/** V(node) per frequency, complex, for the netlist's AC sources. */
export function solveAc(elements: SpiceElement[], frequencies: readonly number[], node = 'out'): { re: number; im: number }[] {
  const names = new Map<string, number>();
  for (const e of elements) for (const n of [e.a, e.b]) if (n !== '0' && !names.has(n)) names.set(n, names.size);
  const nv = names.size;
  const branches = elements.filter((e) => e.kind === 'V' || e.kind === 'L');
  const size = nv + branches.length;
  const idx = (n: string) => (n === '0' ? -1 : names.get(n)!);
  const target = idx(node.toLowerCase());
  return frequencies.map((f) => {
    const w = 2 * Math.PI * f;
    const ar = new Float64Array(size * size);
    const ai = new Float64Array(size * size);
    const br = new Float64Array(size);
    const bi = new Float64Array(size);
    const add = (i: number, j: number, re: number, im: number) => {
      if (i < 0 || j < 0) return;
      ar[i * size + j]! += re;
      ai[i * size + j]! += im;
    };
    const admittance = (a: number, b: number, re: number, im: number) => {
      add(a, a, re, im);
      add(b, b, re, im);
      add(a, b, -re, -im);
      add(b, a, -re, -im);
    };
    let k = nv;
    for (const e of elements) {
      const a = idx(e.a);
      const b = idx(e.b);
      if (e.kind === 'R') admittance(a, b, 1 / e.value, 0);
      else if (e.kind === 'C') admittance(a, b, 0, w * e.value);
      else {
        // branch current k from a to b through the element: KCL rows get ±1, the branch row says
        // V(a) − V(b) − Z·I = E (Z = jωL for an inductor, E = the AC value for a source)
        add(a, k, 1, 0);
        add(b, k, -1, 0);
        add(k, a, 1, 0);
        add(k, b, -1, 0);
        if (e.kind === 'L') add(k, k, 0, -w * e.value);
        else {
          // E = v·e^(jφ); at a multiple of 180° the imaginary part is exactly 0 (sin π rounds to 1.2e-16)
          const phi = (e.phaseDeg * Math.PI) / 180;
          br[k] = e.value * Math.cos(phi);
          bi[k] = e.phaseDeg % 180 === 0 ? 0 : e.value * Math.sin(phi);
        }
        k++;
      }
    }
    // Gaussian elimination with partial pivoting, complex.
    for (let col = 0; col < size; col++) {
      let p = col;
      let best = -1;
      for (let r = col; r < size; r++) {
        const m = Math.hypot(ar[r * size + col]!, ai[r * size + col]!);
        if (m > best) {
          best = m;
          p = r;
        }
      }
      if (best === 0) throw new Error('spice-reference: singular matrix');
      if (p !== col) {
        for (let j = 0; j < size; j++) {
          [ar[p * size + j], ar[col * size + j]] = [ar[col * size + j]!, ar[p * size + j]!];
          [ai[p * size + j], ai[col * size + j]] = [ai[col * size + j]!, ai[p * size + j]!];
        }
        [br[p], br[col]] = [br[col]!, br[p]!];
        [bi[p], bi[col]] = [bi[col]!, bi[p]!];
      }
      const pr = ar[col * size + col]!;
      const pi = ai[col * size + col]!;
      const d = pr * pr + pi * pi;
      for (let r = col + 1; r < size; r++) {
        const xr = ar[r * size + col]!;
        const xi = ai[r * size + col]!;
        if (xr === 0 && xi === 0) continue;
        const mr = (xr * pr + xi * pi) / d;
        const mi = (xi * pr - xr * pi) / d;
        for (let j = col; j < size; j++) {
          const yr = ar[col * size + j]!;
          const yi = ai[col * size + j]!;
          ar[r * size + j]! -= mr * yr - mi * yi;
          ai[r * size + j]! -= mr * yi + mi * yr;
        }
        const yr = br[col]!;
        const yi = bi[col]!;
        br[r]! -= mr * yr - mi * yi;
        bi[r]! -= mr * yi + mi * yr;
      }
    }
    const xr = new Float64Array(size);
    const xi = new Float64Array(size);
    for (let r = size - 1; r >= 0; r--) {
      let sr = br[r]!;
      let si = bi[r]!;
      for (let j = r + 1; j < size; j++) {
        const a1 = ar[r * size + j]!;
        const a2 = ai[r * size + j]!;
        sr -= a1 * xr[j]! - a2 * xi[j]!;
        si -= a1 * xi[j]! + a2 * xr[j]!;
      }
      const pr = ar[r * size + r]!;
      const pi = ai[r * size + r]!;
      const d = pr * pr + pi * pi;
      xr[r] = (sr * pr + si * pi) / d;
      xi[r] = (si * pr - sr * pi) / d;
    }
    return { re: xr[target]!, im: xi[target]! };
  });
}

/** The frequencies of `.ac dec n f1 f2` (SPICE3: f1·10^(k/n) up to f2). */
export function acDecade(perDecade: number, f1: number, f2: number): number[] {
  const out: number[] = [];
  for (let k = 0; ; k++) {
    const f = f1 * 10 ** (k / perDecade);
    if (f > f2 * (1 + 1e-9)) break;
    out.push(f);
  }
  return out;
}
