// What the Listen panel hears of a Harness design: today's presets have one pickup, placed in the
// middle of the usual range along the string; its transfer is the preset's at the current knobs.
// (A whole instrument brings one transfer per pickup, each with its own place.)
import { harnessResponse, type ResponseFunction } from '@shared/audio/impulse';
import { PICKUP_POSITIONS } from '@shared/audio/phrase';
import type { Knobs } from '@shared/circuit/netlist';
import { getPreset, type HarnessPresetId, type HarnessValues } from '@shared/circuit/presets';
import type { ListenDesign } from './use-listen-audio';

export function listenDesignOf(label: string, preset: HarnessPresetId, values: HarnessValues, knobs: Knobs): ListenDesign | null {
  const p = getPreset(preset);
  if (!p) return null;
  try {
    const response = harnessResponse(p.build(values), knobs);
    return { key: `${preset}|${JSON.stringify(values)}|${knobs.volume}|${knobs.tone}`, label, pickups: [{ position: PICKUP_POSITIONS.middle, response }] };
  } catch {
    return null;
  }
}

/** The recording chain: the same wiring at full volume and tone into the recorder's input through its cable. */
export function recordingChainOf(preset: HarnessPresetId, values: HarnessValues, inputR: number, cableLength: number): ResponseFunction {
  const p = getPreset(preset)!;
  return harnessResponse(p.build({ ...values, ampR: inputR, cableLength }), { volume: 10, tone: 10 });
}
