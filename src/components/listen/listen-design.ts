// What the Listen panel hears of a Harness design: today's presets have one pickup, placed in the
// middle of the usual range along the string; its transfer is the preset's at the current knobs.
// A whole instrument (the Harness's instrument panel) brings one transfer per pickup, each with its
// own place along the string.
import { harnessResponse, instrumentResponses, type ResponseFunction } from '@shared/audio/impulse';
import { PICKUP_POSITIONS, pickupPositionOf } from '@shared/audio/phrase';
import { buildLayoutNetlist, getLayout, layoutKnobs, resolveLayoutConfig } from '@shared/circuit/layouts';
import type { Knobs } from '@shared/circuit/netlist';
import { getPreset, type HarnessPresetId, type HarnessValues } from '@shared/circuit/presets';
import type { ListenDesign } from './use-listen-audio';

export function listenDesignOf(label: string, preset: HarnessPresetId, values: HarnessValues, knobs: Knobs): ListenDesign | null {
  const p = getPreset(preset);
  if (!p) return null;
  try {
    const response = harnessResponse(p.build(values), knobs);
    return {
      key: `${preset}|${JSON.stringify(values)}|${knobs.volume}|${knobs.tone}`,
      label,
      pickups: [{ position: PICKUP_POSITIONS.middle, response }],
    };
  } catch {
    return null;
  }
}

/** The recording chain: the same wiring at full volume and tone into the recorder's input through its cable. */
export function recordingChainOf(preset: HarnessPresetId, values: HarnessValues, inputR: number, cableLength: number): ResponseFunction {
  const p = getPreset(preset)!;
  return harnessResponse(p.build({ ...values, ampR: inputR, cableLength }), { volume: 10, tone: 10 });
}

const silent: ResponseFunction = (frequencies, re, im) => {
  re.fill(0, 0, frequencies.length);
  im.fill(0, 0, frequencies.length);
};

/** A whole instrument as the instrument panel holds it. */
export interface ListenInstrument {
  layout: string;
  selector: number;
  options: Record<string, string>;
  knobs: Record<string, number>;
  values: Record<string, number>;
}

/** What Listen hears of a whole instrument at its selector position and knobs: each pickup fed the string at its own place. */
export function listenInstrumentOf(inst: ListenInstrument): ListenDesign | null {
  const layout = getLayout(inst.layout);
  if (!layout) return null;
  const { config, problems } = resolveLayoutConfig(layout, {
    selector: inst.selector,
    options: inst.options,
    values: inst.values,
    knobs: inst.knobs,
  });
  if (problems.length > 0) return null;
  try {
    const r = instrumentResponses(buildLayoutNetlist(layout, config), layoutKnobs(layout, inst.knobs));
    const position = layout.selector.positions[inst.selector]?.name ?? '';
    return {
      key: `layout|${JSON.stringify(inst)}`,
      label: layout.selector.positions.length > 1 ? `${layout.name}, ${position}` : layout.name,
      // every pickup of the layout, those the selector leaves out silent: the phrase keeps one track per pickup place as the selector moves
      pickups: layout.pickups.map((p) => ({
        position: pickupPositionOf(p.id),
        response: r.pickups.find((q) => q.pickupId === p.id)?.response ?? silent,
      })),
    };
  } catch {
    return null;
  }
}

/** The recording chain of a whole instrument: its wiring at full volume and tone into the recorder's input (an amplifier-like load) through its cable. */
export function instrumentChainOf(inst: ListenInstrument, inputR: number, cableLength: number): ResponseFunction {
  const layout = getLayout(inst.layout)!;
  const { config } = resolveLayoutConfig(layout, {
    selector: inst.selector,
    options: { ...inst.options, load: 'amp' },
    values: { ...inst.values, ampR: inputR, cableLength },
  });
  return harnessResponse(buildLayoutNetlist(layout, config), layoutKnobs(layout, {}));
}
