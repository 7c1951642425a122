// The part page's loaded resonance: a measured pickup in the one-pickup layout (independent tone,
// volume and tone at 10) into one of the loads of loads.ts through a cable, solved with the
// harness engine.
import { buildLayoutNetlist, getLayout, resolveLayoutConfig } from './layouts';
import { DEFAULT_CABLE, LOADS, type CableChoice, type LoadId } from './loads';
import { simulate, type ResponseMetrics } from './metrics';

export interface PickupModel {
  R: number;
  L: number;
  C: number;
  Rp?: number | null;
}

/**
 * A measured pickup with volume and tone at 10 (500 kΩ each by default), the chosen load (its
 * default input figures) and cable: for a buffered pedal the cable is the one before the buffer.
 */
export function loadedResponse(
  pickup: PickupModel,
  opts: { load?: LoadId; cable?: CableChoice; volumeR?: number; toneR?: number } = {},
): ResponseMetrics {
  const layout = getLayout('one-pickup')!;
  const load = opts.load ?? 'amp';
  const cable = opts.cable ?? DEFAULT_CABLE;
  const { config, problems } = resolveLayoutConfig(layout, {
    options: { load },
    values: {
      pickupR: pickup.R,
      pickupL: pickup.L,
      pickupC: pickup.C,
      ...(pickup.Rp != null ? { pickupRp: pickup.Rp } : {}),
      volumeR: opts.volumeR ?? 500e3,
      toneR: opts.toneR ?? 500e3,
      cableCapPerMetre: cable.capPerMetre,
      [LOADS[load].cableKey]: cable.lengthM,
    },
  });
  if (problems.length > 0) throw new Error(problems[0]!.message);
  return simulate(buildLayoutNetlist(layout, config), { volume: 10, tone: 10 }).metrics;
}
