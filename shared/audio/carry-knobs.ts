// Comparing two wirings "at the same knob settings" when their layouts differ (the report's
// before/after clips, Listen on a job's page): a knob takes the other design's setting of the same
// knob id, else of the same role (its first volume or first tone knob), else 10.
import { toneKnobs, volumeKnobs, type LayoutDef } from '@shared/circuit/layouts';

export function carryKnobs(from: LayoutDef, knobs: Record<string, number>, to: LayoutDef): Record<string, number> {
  const volume = knobs[volumeKnobs(from)[0] ?? ''] ?? 10;
  const tone = knobs[toneKnobs(from)[0] ?? ''] ?? 10;
  const vol = new Set(volumeKnobs(to));
  const ton = new Set(toneKnobs(to));
  const out: Record<string, number> = {};
  for (const k of to.knobs) out[k.id] = knobs[k.id] ?? (vol.has(k.id) ? volume : ton.has(k.id) ? tone : 10);
  return out;
}
