// Bodies of the harness routes: a preset with part values, or a whole netlist, and the knobs.
import { z } from 'zod';
import { TAPER_LAWS } from '@shared/taper/law';

const positive = z.number().finite().positive('Must be more than zero.');
/** A pot's law with its mid-rotation value m = y(0.5) (shared/taper/law.ts); linear has none. */
export const TaperLawSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('linear') }),
  z.object({ kind: z.enum(TAPER_LAWS).exclude(['linear']), m: z.number().gt(0).lt(1) }),
]);

export const HARNESS_PRESET_IDS = [
  'independent-tone',
  'interactive-tone',
  'bleed-cap',
  'bleed-cap-parallel-r',
  'bleed-cap-series-r',
  'tone-floor-resistor',
  'dual-cap-tone',
] as const;
export const HarnessPresetIdSchema = z.enum(HARNESS_PRESET_IDS);

/** Any subset of a preset's values; the rest come from the preset's defaults. SI units. */
export const HarnessValuesSchema = z
  .object({
    pickupR: positive,
    pickupL: positive,
    pickupC: positive,
    pickupRp: positive.optional(),
    volumeR: positive,
    volumeLaw: TaperLawSchema,
    toneR: positive,
    toneLaw: TaperLawSchema,
    toneC: positive,
    bleedC: positive,
    bleedR: positive,
    floorR: positive,
    secondC: positive,
    cableCapPerMetre: z.number().finite().min(0),
    cableLength: z.number().finite().min(0).max(100),
    ampR: positive,
  })
  .partial();
export type HarnessValuesInput = z.infer<typeof HarnessValuesSchema>;

const node = z.string().min(1).max(40);
const KnobRefSchema = z.union([z.enum(['volume', 'tone']), z.object({ fixed: z.number().min(0).max(10) })]);
export const NetlistSchema = z.object({
  title: z.string().max(120).optional(),
  parts: z
    .array(
      z.discriminatedUnion('kind', [
        z.object({ kind: z.literal('resistor'), id: z.string().min(1).max(40), a: node, b: node, R: positive }),
        z.object({ kind: z.literal('capacitor'), id: z.string().min(1).max(40), a: node, b: node, C: positive }),
        z.object({ kind: z.literal('inductor'), id: z.string().min(1).max(40), a: node, b: node, L: positive }),
        z.object({ kind: z.literal('pot'), id: z.string().min(1).max(40), a: node, b: node.optional(), w: node, R: positive, law: TaperLawSchema, knob: KnobRefSchema }),
        z.object({ kind: z.literal('pickup'), id: z.string().min(1).max(40), hot: node, cold: node, R: positive, L: z.number().min(0), C: z.number().min(0), Rp: positive.optional(), emf: positive.optional() }),
      ]),
    )
    .min(1)
    .max(200),
});

const knob = z.number().finite().min(0, 'Knobs go from 0 to 10.').max(10, 'Knobs go from 0 to 10.');
export const KnobsSchema = z.object({ volume: knob, tone: knob });

const FrequenciesSchema = z.array(z.number().finite().positive().max(1e6)).min(2).max(2000);

const HarnessSource = z.object({
  preset: HarnessPresetIdSchema.optional(),
  netlist: NetlistSchema.optional(),
  values: HarnessValuesSchema.optional(),
});

const oneSource = <T extends { preset?: unknown; netlist?: unknown }>(b: T) => (b.preset === undefined) !== (b.netlist === undefined);
const oneSourceMessage = { message: 'Give either a preset or a netlist.', path: ['preset'] };

export const SimulateRequestSchema = HarnessSource.extend({ knobs: KnobsSchema, frequencies: FrequenciesSchema.optional() }).refine(oneSource, oneSourceMessage);
export type SimulateRequest = z.infer<typeof SimulateRequestSchema>;

export const SweepRequestSchema = HarnessSource.extend({
  volume: z.array(knob).min(1).max(41).optional(),
  tone: z.array(knob).min(1).max(41).optional(),
  frequencies: FrequenciesSchema.optional(),
}).refine(oneSource, oneSourceMessage);
export type SweepRequest = z.infer<typeof SweepRequestSchema>;

export const NetlistRequestSchema = SimulateRequestSchema;

export const HarnessDesignInputSchema = z.object({
  name: z.string().trim().min(1, 'Name the design.').max(80),
  preset: HarnessPresetIdSchema,
  values: HarnessValuesSchema,
  /** Measured parts whose values the design uses, by value key: { volumeR: partId, … }. */
  partRefs: z.record(z.string(), z.number().int().positive()).optional().nullable(),
  notes: z.string().trim().max(2000).optional().nullable(),
});
export type HarnessDesignInput = z.infer<typeof HarnessDesignInputSchema>;
