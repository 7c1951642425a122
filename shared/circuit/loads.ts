// What a guitar's output drives, defined once: the loads (amplifier input, buffered pedal,
// low-impedance pedal input), their value keys and defaults, the cable, and the netlist fragment
// they add at the output. The presets, the layouts (the `load` option and its values), Compare's
// loaded taper, the part page's loaded resonance and the screens all read it from here.
//
// Each load is a resistance to ground at the output, with an optional capacitance beside it, and
// the capacitance of the cable that loads the pickup (length × capacitance per metre).
//
// Values are common practice (no published source): a valve or solid-state amplifier input of
// about 1 MΩ; a buffered pedal's input of about 1 MΩ, where only the cable before the buffer loads
// the pickup (the buffer drives the cable after it); a low-impedance pedal input of 10 kΩ (from
// memory: some vintage-style fuzz inputs are a few kΩ to tens of kΩ; enter the pedal's own figure).
// Cable 100 pF/m, 3 m.
import { GROUND, OUTPUT, type Part } from './netlist';

export const LOAD_IDS = ['amp', 'buffer', 'low-impedance-pedal'] as const;
export type LoadId = (typeof LOAD_IDS)[number];

export interface LoadDefinition {
  id: LoadId;
  name: string;
  /** The value key of the input resistance, and its default (Ω). */
  inputKey: 'ampR' | 'bufferR' | 'pedalR';
  inputDefault: number;
  /** The value key of an input capacitance beside it (absent means 0), if the load has one. */
  inputCKey: 'ampC' | null;
  /** The value key of the length of cable that loads the pickup. */
  cableKey: 'cableLength' | 'cableBeforeBuffer';
  /** The netlist id of the input resistor (also its SPICE element name). */
  partId: string;
}

export const LOADS: Readonly<Record<LoadId, LoadDefinition>> = {
  amp: {
    id: 'amp',
    name: 'Amplifier input',
    inputKey: 'ampR',
    inputDefault: 1e6,
    inputCKey: 'ampC',
    cableKey: 'cableLength',
    partId: 'amp',
  },
  buffer: {
    id: 'buffer',
    name: 'Buffered pedal',
    inputKey: 'bufferR',
    inputDefault: 1e6,
    inputCKey: null,
    cableKey: 'cableBeforeBuffer',
    partId: 'buffer',
  },
  'low-impedance-pedal': {
    id: 'low-impedance-pedal',
    name: 'Low-impedance pedal input',
    inputKey: 'pedalR',
    inputDefault: 10e3,
    inputCKey: null,
    cableKey: 'cableLength',
    partId: 'pedal',
  },
};

export const isLoadId = (id: unknown): id is LoadId => typeof id === 'string' && (LOAD_IDS as readonly string[]).includes(id);

export interface CableChoice {
  lengthM: number;
  capPerMetre: number;
}

export const DEFAULT_CABLE: CableChoice = { lengthM: 3, capPerMetre: 100e-12 };

/** A value a load uses, in the shape of a layout's value definitions (layouts.ts spreads these). */
export interface LoadValueDef {
  key: string;
  name: string;
  quantity: 'resistance' | 'capacitance' | 'length' | 'capacitance-per-length';
  unit: string;
  default: number;
  range: 'positive' | 'non-negative';
}

/** Every load value of a layout, with its default. `ampC` defaults to 0, so the presets keep their figures. */
export const LOAD_VALUES: readonly LoadValueDef[] = [
  {
    key: 'cableCapPerMetre',
    name: 'Cable capacitance per metre',
    quantity: 'capacitance-per-length',
    unit: 'F/m',
    default: DEFAULT_CABLE.capPerMetre,
    range: 'non-negative',
  },
  {
    key: 'cableLength',
    name: 'Cable length (to the amplifier or pedal)',
    quantity: 'length',
    unit: 'm',
    default: DEFAULT_CABLE.lengthM,
    range: 'non-negative',
  },
  {
    key: 'ampR',
    name: 'Amplifier input resistance',
    quantity: 'resistance',
    unit: 'Ω',
    default: LOADS.amp.inputDefault,
    range: 'positive',
  },
  { key: 'ampC', name: 'Amplifier input capacitance', quantity: 'capacitance', unit: 'F', default: 0, range: 'non-negative' },
  {
    key: 'bufferR',
    name: 'Buffered pedal input resistance',
    quantity: 'resistance',
    unit: 'Ω',
    default: LOADS.buffer.inputDefault,
    range: 'positive',
  },
  {
    key: 'cableBeforeBuffer',
    name: 'Cable before the buffer',
    quantity: 'length',
    unit: 'm',
    default: DEFAULT_CABLE.lengthM,
    range: 'non-negative',
  },
  {
    key: 'pedalR',
    name: "Low-impedance pedal input resistance (from memory; enter your pedal's)",
    quantity: 'resistance',
    unit: 'Ω',
    default: LOADS['low-impedance-pedal'].inputDefault,
    range: 'positive',
  },
];

/** The value keys a load uses (the screen shows these under "The load"). */
export function loadValueKeys(id: LoadId): string[] {
  const l = LOADS[id];
  return ['cableCapPerMetre', l.cableKey, l.inputKey, ...(l.inputCKey ? [l.inputCKey] : [])];
}

/** A load with its figures: input resistance R, input capacitance C, and the cable capacitance that loads the pickup. */
export interface LoadSetting {
  id: LoadId;
  /** Ω */
  R: number;
  /** F (0: none) */
  C: number;
  /** F: cable length × capacitance per metre (0: no cable) */
  cableC: number;
}

const numberOr = (v: unknown, d: number) => (typeof v === 'number' && Number.isFinite(v) ? v : d);

/** The load's figures from a layout's (or a preset's) values; a value left out takes its default. */
export function loadSettingOf(id: LoadId, values: Readonly<Record<string, unknown>>): LoadSetting {
  const l = LOADS[id];
  const def = (key: string) => LOAD_VALUES.find((d) => d.key === key)!.default;
  const perMetre = numberOr(values.cableCapPerMetre, def('cableCapPerMetre'));
  return {
    id,
    R: numberOr(values[l.inputKey], l.inputDefault),
    C: l.inputCKey ? numberOr(values[l.inputCKey], 0) : 0,
    cableC: perMetre * numberOr(values[l.cableKey], def(l.cableKey)),
  };
}

/** An amplifier input of R through a cable of the given length and capacitance per metre. */
export function ampLoad(R: number, cable: CableChoice = DEFAULT_CABLE): LoadSetting {
  return { id: 'amp', R, C: 0, cableC: cable.lengthM * cable.capPerMetre };
}

/** The parts the load adds at the output: the cable (when it has any capacitance), the input resistor, the input capacitance (when above 0). */
export function loadParts(s: LoadSetting): Part[] {
  const parts: Part[] = [];
  // No cable (a direct connection, or a wireless link) means no capacitor, not a 0 F one.
  if (s.cableC > 0) parts.push({ kind: 'capacitor', id: 'cable', a: OUTPUT, b: GROUND, C: s.cableC });
  parts.push({ kind: 'resistor', id: LOADS[s.id].partId, a: OUTPUT, b: GROUND, R: s.R });
  if (s.C > 0) parts.push({ kind: 'capacitor', id: `${LOADS[s.id].partId}-c`, a: OUTPUT, b: GROUND, C: s.C });
  return parts;
}
