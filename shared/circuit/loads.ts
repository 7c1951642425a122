// What a guitar's output drives: the input a cable ends in, defined once for the part page, the
// Harness and Compare. Each load is a resistance to ground with a capacitance beside it; the cable
// is its length times its capacitance per metre.
//
// Values are common practice (no published source): a valve or solid-state amplifier input of
// about 1 MΩ; a buffered pedal input of about 1 MΩ with a little input capacitance; a low-impedance
// pedal input (some fuzz and wah circuits) of about 10 kΩ. Cable 100 pF/m, 3 m.
import { simulate, type ResponseMetrics } from './metrics';
import { DEFAULT_HARNESS_VALUES, getPreset, type HarnessValues } from './presets';

export const LOAD_IDS = ['amplifier-input', 'buffered-pedal', 'low-impedance-pedal'] as const;
export type LoadId = (typeof LOAD_IDS)[number];

export interface LoadDefinition {
  id: LoadId;
  name: string;
  /** Input resistance to ground, Ω. */
  R: number;
  /** Input capacitance to ground, F (added to the cable's). */
  C: number;
}

export const LOADS: Readonly<Record<LoadId, LoadDefinition>> = {
  'amplifier-input': { id: 'amplifier-input', name: 'Amplifier input (1 MΩ)', R: 1e6, C: 0 },
  'buffered-pedal': { id: 'buffered-pedal', name: 'Buffered pedal (1 MΩ, 20 pF)', R: 1e6, C: 20e-12 },
  'low-impedance-pedal': { id: 'low-impedance-pedal', name: 'Low-impedance pedal input (10 kΩ)', R: 10e3, C: 0 },
};

export interface CableChoice {
  lengthM: number;
  capPerMetre: number;
}

export const DEFAULT_CABLE: CableChoice = { lengthM: 3, capPerMetre: 100e-12 };

/** The harness values a load and cable stand for: the load's capacitance rides on the cable's. */
export function loadValues(load: LoadDefinition, cable: CableChoice): Pick<HarnessValues, 'ampR' | 'cableCapPerMetre' | 'cableLength'> {
  // The load capacitance is folded into the cable's per-metre figure (one capacitor to ground).
  const lengthM = cable.lengthM > 0 ? cable.lengthM : 1;
  const totalC = cable.capPerMetre * cable.lengthM + load.C;
  return { ampR: load.R, cableLength: lengthM, cableCapPerMetre: totalC / lengthM };
}

export interface PickupModel {
  R: number;
  L: number;
  C: number;
  Rp?: number | null;
}

/**
 * A measured pickup in the independent-tone harness with volume and tone at 10 (500 kΩ each by
 * default), the chosen cable and load, solved with the harness engine.
 */
export function loadedResponse(
  pickup: PickupModel,
  opts: { load?: LoadDefinition; cable?: CableChoice; volumeR?: number; toneR?: number } = {},
): ResponseMetrics {
  const preset = getPreset('independent-tone')!;
  const values: HarnessValues = {
    ...DEFAULT_HARNESS_VALUES,
    pickupR: pickup.R,
    pickupL: pickup.L,
    pickupC: pickup.C,
    ...(pickup.Rp != null ? { pickupRp: pickup.Rp } : {}),
    volumeR: opts.volumeR ?? 500e3,
    toneR: opts.toneR ?? 500e3,
    ...loadValues(opts.load ?? LOADS['amplifier-input'], opts.cable ?? DEFAULT_CABLE),
  };
  return simulate(preset.build(values), { volume: 10, tone: 10 }).metrics;
}
