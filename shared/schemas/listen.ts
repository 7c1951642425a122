// Bodies of the Listen routes. POST /api/harness/render is multipart: the file, and two JSON text
// fields, `design` (the body of /api/harness/simulate) and an optional `chain` (how the recording
// was made: the same instrument's present wiring at full volume and tone into the recorder's input).
import { z } from 'zod';
import { HarnessPresetIdSchema, HarnessValuesSchema, NetlistSchema, SimulateRequestSchema } from './harness';

/** A multipart text field holding JSON, checked against `schema` (problems named under the field). */
const jsonField = <T extends z.ZodType>(schema: T) =>
  z
    .string()
    .transform((text, ctx) => {
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'Not valid JSON.' });
        return z.NEVER;
      }
    })
    .pipe(schema);

/** Defaults of the recording chain: a 1 MΩ input (an amplifier-like instrument input) and 3 m of cable. */
export const RECORDING_CHAIN_DEFAULTS = { inputR: 1e6, cableLength: 3 } as const;

export const RecordingChainSchema = z
  .object({
    preset: HarnessPresetIdSchema.optional(),
    netlist: NetlistSchema.optional(),
    values: HarnessValuesSchema.optional(),
    /** The recorder's input resistance, Ω (replaces the amplifier input of the wiring). */
    inputR: z.number().finite().min(1e3, 'At least 1 kΩ.').max(1e8, 'At most 100 MΩ.').default(RECORDING_CHAIN_DEFAULTS.inputR),
    /** Cable from the instrument to the recorder, m. */
    cableLength: z.number().finite().min(0).max(100).default(RECORDING_CHAIN_DEFAULTS.cableLength),
  })
  .refine((b) => (b.preset === undefined) !== (b.netlist === undefined), {
    message: 'Give either a preset or a netlist.',
    path: ['preset'],
  });
export type RecordingChain = z.infer<typeof RecordingChainSchema>;

/** The built-in phrase instead of a file: each pickup hears the string at its own place. */
export const RenderPhraseSchema = z.object({
  sampleRate: z.number().int().min(22050, 'At least 22050 Hz.').max(96000, 'At most 96000 Hz.').default(48000),
  seed: z
    .number()
    .int()
    .min(0)
    .max(2 ** 31)
    .optional(),
});
export type RenderPhrase = z.infer<typeof RenderPhraseSchema>;

export const RenderFieldsSchema = z.object({
  design: jsonField(SimulateRequestSchema),
  chain: jsonField(RecordingChainSchema).optional(),
  /** Render the built-in phrase (no file); with a file, leave it out. */
  phrase: jsonField(RenderPhraseSchema).optional(),
});
export type RenderFields = z.infer<typeof RenderFieldsSchema>;

/** Limits of a file sent to be rendered. */
export const RENDER_LIMITS = { maxSeconds: 60, maxBytes: 20_000_000 } as const;
