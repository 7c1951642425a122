// Bodies of the harness routes: a preset with part values, or a whole netlist, and the knobs.
import { z } from 'zod';
import { TAPER_LAWS } from '@shared/taper/law';
import { rangeNumber, rangeNumberOrZero } from './ranges';

// Every value's bounds come from the one range table (ranges.ts).
const ohms = rangeNumber('resistance');
const farads = rangeNumber('capacitance');
const henries = rangeNumber('inductance');
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
    pickupR: ohms,
    pickupL: henries,
    pickupC: farads,
    pickupRp: ohms.optional(),
    volumeR: ohms,
    volumeLaw: TaperLawSchema,
    toneR: ohms,
    toneLaw: TaperLawSchema,
    toneC: farads,
    bleedC: farads,
    bleedR: ohms,
    floorR: ohms,
    secondC: farads,
    cableCapPerMetre: rangeNumber('cableCapPerMetre'),
    cableLength: rangeNumber('cableLength'),
    ampR: ohms,
  })
  .partial();
export type HarnessValuesInput = z.infer<typeof HarnessValuesSchema>;

const node = z.string().min(1).max(40);
const KnobRefSchema = z.union([z.enum(['volume', 'tone']), z.object({ fixed: rangeNumber('knob') })]);
export const NetlistSchema = z.object({
  title: z.string().max(120).optional(),
  parts: z
    .array(
      z.discriminatedUnion('kind', [
        z.object({ kind: z.literal('resistor'), id: z.string().min(1).max(40), a: node, b: node, R: ohms }),
        z.object({ kind: z.literal('capacitor'), id: z.string().min(1).max(40), a: node, b: node, C: farads }),
        z.object({ kind: z.literal('inductor'), id: z.string().min(1).max(40), a: node, b: node, L: henries }),
        z.object({ kind: z.literal('pot'), id: z.string().min(1).max(40), a: node, b: node.optional(), w: node, R: ohms, law: TaperLawSchema, knob: KnobRefSchema }),
        z.object({ kind: z.literal('pickup'), id: z.string().min(1).max(40), hot: node, cold: node, R: ohms, L: rangeNumberOrZero('inductance'), C: rangeNumberOrZero('capacitance'), Rp: ohms.optional(), emf: z.number().finite().positive().max(1e3).optional() }),
      ]),
    )
    .min(1)
    .max(200),
});

const knob = rangeNumber('knob');
export const KnobsSchema = z.object({ volume: knob, tone: knob });

const FrequenciesSchema = z
  .array(rangeNumber('frequency'))
  .min(2, 'Give at least two frequencies (the list is empty or has one).')
  .max(2000);

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
