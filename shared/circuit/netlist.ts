// The netlist model of a harness: parts between named nodes. Ground is the node '0'; the engine's
// transfer is the voltage at the node 'out' per volt of pickup EMF.
import { lawValue, type TaperLaw } from '@shared/taper/law';

export const GROUND = '0';
export const OUTPUT = 'out';

/**
 * Knob settings on the 0–10 dial by knob id (`volume`, `tone`, `neck.volume`, `tone1` …); rotation
 * x = knob / 10. A knob the record does not name is at 10.
 */
export type Knobs = Readonly<Record<string, number>>;

export type KnobName = string;

/** The two knobs of a one-pickup harness (the presets and the one-pickup layout). */
export type VolumeToneKnobs = {
  volume: number;
  tone: number;
};

/** The dial value of a knob when a setting does not name it. */
export const KNOB_DEFAULT = 10;

/** A pot follows one of the harness knobs or sits at a fixed dial setting (0–10). */
export type KnobRef = KnobName | { fixed: number };

/**
 * The smallest resistance a pot half can take. A pot at its end stop would otherwise put 0 Ω (an
 * infinite conductance) in the matrix. 1 mΩ is far below any real wiper contact resistance, so it
 * changes no audible figure (a 1 mΩ volume "short" still leaves about −170 dB at the output), while
 * its 1000 S conductance against the ~1 µS of a 1 MΩ load keeps the conductance spread near 1e9,
 * well inside double precision. The SPICE export writes the same clamped value, so ngspice sees it.
 */
export const MIN_POT_RESISTANCE = 1e-3;

export interface ResistorPart {
  kind: 'resistor';
  id: string;
  a: string;
  b: string;
  /** Ω */
  R: number;
}

export interface CapacitorPart {
  kind: 'capacitor';
  id: string;
  a: string;
  b: string;
  /** F */
  C: number;
}

export interface InductorPart {
  kind: 'inductor';
  id: string;
  a: string;
  b: string;
  /** H */
  L: number;
}

/**
 * A three-terminal pot: ends a and b, wiper w. The wiper-to-a resistance is R·y(x), the wiper-to-b
 * resistance R·(1 − y(x)), both clamped to MIN_POT_RESISTANCE. Leave b out for a pot used as a
 * variable resistor (its other half then carries no current and is not stamped).
 */
export interface PotPart {
  kind: 'pot';
  id: string;
  a: string;
  b?: string;
  w: string;
  /** End-to-end resistance, Ω */
  R: number;
  law: TaperLaw;
  knob: KnobRef;
}

/**
 * The pickup's lumped model (docs/computation.md §4): an EMF (1 V unless given) in series with R and L
 * from the cold to the hot terminal, C across the terminals and optionally a loss resistance Rp.
 * R must be positive; L and C may be 0 (an ideal resistive source, used by the closed-form checks).
 */
export interface PickupPart {
  kind: 'pickup';
  id: string;
  hot: string;
  cold: string;
  /** Ω */
  R: number;
  /** H */
  L: number;
  /** F */
  C: number;
  /** Ω; absent means no parallel loss */
  Rp?: number;
  /** V; 1 when absent. A negative value is a reversed source (phase 180°). */
  emf?: number;
  /**
   * The pickup this source belongs to, for per-pickup transfers (superposition); the part id when
   * absent. The coils of a dual-coil pickup are two sources with the same group.
   */
  group?: string;
}

export type Part = ResistorPart | CapacitorPart | InductorPart | PotPart | PickupPart;

export interface Netlist {
  title?: string;
  parts: Part[];
}

/** Knob dial value (0–10) that a pot is set to. */
export function knobSetting(ref: KnobRef, knobs: Knobs): number {
  return typeof ref === 'string' ? (knobs[ref] ?? KNOB_DEFAULT) : ref.fixed;
}

/** The two halves of a pot at a knob setting: wiper-to-a and wiper-to-b, clamped, in Ω. */
export function potHalves(pot: PotPart, knobs: Knobs): { aw: number; wb: number } {
  const y = lawValue(pot.law, knobSetting(pot.knob, knobs) / 10);
  return {
    aw: Math.max(pot.R * y, MIN_POT_RESISTANCE),
    wb: Math.max(pot.R * (1 - y), MIN_POT_RESISTANCE),
  };
}

/** Checks what the solver relies on; returns a list of problems (empty when the netlist is usable). */
export function validateNetlist(netlist: Netlist): string[] {
  const problems: string[] = [];
  const ids = new Set<string>();
  const nodes = new Set<string>();
  let sources = 0;
  const positive = (id: string, name: string, v: number | undefined) => {
    if (v === undefined) return;
    if (!(Number.isFinite(v) && v > 0)) problems.push(`${id}: ${name} must be a positive finite number (got ${v})`);
  };
  const nonNegative = (id: string, name: string, v: number) => {
    if (!(Number.isFinite(v) && v >= 0)) problems.push(`${id}: ${name} must be a finite number ≥ 0 (got ${v})`);
  };
  for (const p of netlist.parts) {
    if (ids.has(p.id)) problems.push(`duplicate part id "${p.id}"`);
    ids.add(p.id);
    switch (p.kind) {
      case 'resistor':
        positive(p.id, 'R', p.R);
        nodes.add(p.a).add(p.b);
        break;
      case 'capacitor':
        positive(p.id, 'C', p.C);
        nodes.add(p.a).add(p.b);
        break;
      case 'inductor':
        positive(p.id, 'L', p.L);
        nodes.add(p.a).add(p.b);
        break;
      case 'pot':
        positive(p.id, 'R', p.R);
        nodes.add(p.a).add(p.w);
        if (p.b !== undefined) nodes.add(p.b);
        break;
      case 'pickup':
        sources++;
        positive(p.id, 'R', p.R);
        nonNegative(p.id, 'L', p.L);
        nonNegative(p.id, 'C', p.C);
        positive(p.id, 'Rp', p.Rp);
        if (p.emf !== undefined && !(Number.isFinite(p.emf) && p.emf !== 0))
          problems.push(`${p.id}: emf must be a finite non-zero number (got ${p.emf})`);
        if (p.hot === p.cold) problems.push(`${p.id}: hot and cold are the same node`);
        nodes.add(p.hot).add(p.cold);
        break;
    }
  }
  if (sources === 0) problems.push('no pickup (source) in the netlist');
  if (!nodes.has(OUTPUT)) problems.push(`no output node "${OUTPUT}"`);
  if (!nodes.has(GROUND)) problems.push(`no ground node "${GROUND}"`);
  return problems;
}
