// A job's "before" wiring and its recording chain: what the customer report's before/after clips
// are rendered through (PUT /api/jobs/:id/before). Kept apart from jobs.ts, which the database
// schema loads at run time without the path aliases this file's imports use.
import { z } from 'zod';
import { HarnessPresetIdSchema, KnobRecordSchema, LayoutIdSchema, LayoutOptionsSchema, LayoutValuesSchema } from './harness';
import { RECORDING_CHAIN_DEFAULTS } from './listen';

/** A design body kept with the job: a layout (or, in the older shape, a preset) with its values. */
export const BeforeDesignInputSchema = z.object({
  name: z.string().trim().min(1).max(80).optional(),
  layout: LayoutIdSchema.optional(),
  selector: z.number().int().min(0).max(9).optional(),
  options: LayoutOptionsSchema.optional(),
  knobs: KnobRecordSchema.optional().nullable(),
  preset: HarnessPresetIdSchema.optional(),
  values: LayoutValuesSchema.default({}),
});

/** The stored shape (always a layout; a preset body becomes the one-pickup layout with the preset's options). */
export interface BeforeDesign {
  name: string | null;
  layout: string;
  selector: number;
  options: Record<string, string>;
  knobs: Record<string, number> | null;
  preset: string | null;
  values: Record<string, unknown>;
}

export const RecordingChainInputSchema = z.object({
  /** The recorder's input resistance, Ω. */
  inputR: z.number().finite().min(1e3, 'At least 1 kΩ.').max(1e8, 'At most 100 MΩ.').default(RECORDING_CHAIN_DEFAULTS.inputR),
  /** Cable from the instrument to the recorder, m. */
  cableLength: z.number().finite().min(0, 'Not negative.').max(100, 'At most 100 m.').default(RECORDING_CHAIN_DEFAULTS.cableLength),
});
export type RecordingChain = z.infer<typeof RecordingChainInputSchema>;

/**
 * PUT /api/jobs/:id/before: the wiring before the work, as a saved design (`harnessId`) or a design
 * body (`design`), not both; null clears it. `recordingChain`: how the job's recording was made.
 */
export const JobBeforeInputSchema = z.object({
  harnessId: z.number().int().positive().nullable().optional(),
  design: BeforeDesignInputSchema.nullable().optional(),
  recordingChain: RecordingChainInputSchema.nullable().optional(),
});
export type JobBeforeInput = z.infer<typeof JobBeforeInputSchema>;

/** The clips of the customer report: at most this long each. */
export const CLIP_MAX_SECONDS = 10;
