// Bodies of the harness routes: a preset with part values, or a whole netlist, and the knobs.
import { z } from 'zod';
import { LAYOUT_IDS } from '../circuit/layouts';
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
const KnobRefSchema = z.union([z.string().min(1).max(40), z.object({ fixed: rangeNumber('knob') })]);
export const NetlistSchema = z.object({
  title: z.string().max(120).optional(),
  parts: z
    .array(
      z.discriminatedUnion('kind', [
        z.object({ kind: z.literal('resistor'), id: z.string().min(1).max(40), a: node, b: node, R: ohms }),
        z.object({ kind: z.literal('capacitor'), id: z.string().min(1).max(40), a: node, b: node, C: farads }),
        z.object({ kind: z.literal('inductor'), id: z.string().min(1).max(40), a: node, b: node, L: henries }),
        z.object({
          kind: z.literal('pot'),
          id: z.string().min(1).max(40),
          a: node,
          b: node.optional(),
          w: node,
          R: ohms,
          law: TaperLawSchema,
          knob: KnobRefSchema,
        }),
        z.object({
          kind: z.literal('pickup'),
          id: z.string().min(1).max(40),
          hot: node,
          cold: node,
          R: ohms,
          L: rangeNumberOrZero('inductance'),
          C: rangeNumberOrZero('capacitance'),
          Rp: ohms.optional(),
          emf: z
            .number()
            .finite()
            .min(-1e3)
            .max(1e3)
            .refine((v) => v !== 0, 'A source of 0 V gives nothing.')
            .optional(),
          group: z.string().min(1).max(40).optional(),
        }),
      ]),
    )
    .min(1)
    .max(200),
});

const knob = rangeNumber('knob');
export const KnobsSchema = z.object({ volume: knob, tone: knob });
/** Knob settings by knob id; a knob left out is at 10. */
export const KnobRecordSchema = z.record(z.string().min(1).max(40), knob);

export const LayoutIdSchema = z.enum(LAYOUT_IDS as [string, ...string[]]);
/** A layout's values by key, checked against the layout's list in the handler (unknown key: 422). */
export const LayoutValuesSchema = z.record(z.string().min(1).max(40), z.union([z.number(), TaperLawSchema]));
export const LayoutOptionsSchema = z.record(z.string().min(1).max(40), z.string().min(1).max(40));

const FrequenciesSchema = z
  .array(rangeNumber('frequency'))
  .min(2, 'Give at least two frequencies (the list is empty or has one).')
  .max(2000);

/**
 * What a request simulates: a layout with its selector position, options and values (the whole
 * instrument), a preset with values (the one-pickup networks, kept for older clients), or a netlist.
 * Values are checked in the handler against the layout's or preset's list, so an unknown key is a 422.
 */
const HarnessSource = z.object({
  layout: LayoutIdSchema.optional(),
  selector: z.number().int().min(0).max(9).optional(),
  options: LayoutOptionsSchema.optional(),
  preset: HarnessPresetIdSchema.optional(),
  netlist: NetlistSchema.optional(),
  values: LayoutValuesSchema.optional(),
});

const oneSource = <T extends { preset?: unknown; netlist?: unknown; layout?: unknown }>(b: T) =>
  [b.preset, b.netlist, b.layout].filter((x) => x !== undefined).length === 1;
const oneSourceMessage = { message: 'Give one of a layout, a preset or a netlist.', path: ['layout'] };

export const SimulateRequestSchema = HarnessSource.extend({
  knobs: KnobRecordSchema.optional(),
  frequencies: FrequenciesSchema.optional(),
}).refine(oneSource, oneSourceMessage);
export type SimulateRequest = z.infer<typeof SimulateRequestSchema>;

export const SweepRequestSchema = HarnessSource.extend({
  volume: z.array(knob).min(1).max(41).optional(),
  tone: z.array(knob).min(1).max(41).optional(),
  /** the knob ids of the two axes (default: the layout's first volume and first tone) */
  volumeKnob: z.string().min(1).max(40).optional(),
  toneKnob: z.string().min(1).max(40).optional(),
  /** the other knobs */
  knobs: KnobRecordSchema.optional(),
  frequencies: FrequenciesSchema.optional(),
}).refine(oneSource, oneSourceMessage);
export type SweepRequest = z.infer<typeof SweepRequestSchema>;

export const NetlistRequestSchema = SimulateRequestSchema;

export const BleedFinderRequestSchema = z.object({
  layout: LayoutIdSchema,
  selector: z.number().int().min(0).max(9).optional(),
  options: LayoutOptionsSchema.optional(),
  values: LayoutValuesSchema.optional(),
  knobs: KnobRecordSchema.optional(),
  series: z.enum(['E12', 'E24']).optional(),
  weight: z.number().min(0, 'The weight lies between 0 and 1.').max(1, 'The weight lies between 0 and 1.').optional(),
});
export type BleedFinderRequest = z.infer<typeof BleedFinderRequestSchema>;

/**
 * A saved design: the whole instrument (layout, selector position, options, knobs, values; the
 * load is the `load` option with its values). A design in the older shape (a preset instead of a
 * layout) is still accepted and stored as the one-pickup layout with the preset's options.
 */
export const HarnessDesignInputSchema = z.object({
  name: z.string().trim().min(1, 'Name the design.').max(80),
  layout: LayoutIdSchema.optional(),
  selector: z.number().int().min(0).max(9).optional(),
  options: LayoutOptionsSchema.optional(),
  knobs: KnobRecordSchema.optional().nullable(),
  preset: HarnessPresetIdSchema.optional(),
  values: LayoutValuesSchema,
  /** Measured parts whose values the design uses, by value key: { volumeR: partId, … }. */
  partRefs: z.record(z.string(), z.number().int().positive()).optional().nullable(),
  notes: z.string().trim().max(2000).optional().nullable(),
});
export type HarnessDesignInput = z.infer<typeof HarnessDesignInputSchema>;

/** A saved harness design as the server stores and sends it (GET /api/harnesses, POST, PUT). */
export interface HarnessDesign {
  id: number;
  name: string;
  /** The whole instrument: layout id, selector position, option choices, knob settings. */
  layout: string;
  selector: number;
  options: Record<string, string>;
  knobs: Record<string, number> | null;
  /** The preset a design was first saved from (older designs); null for designs saved as a layout. */
  preset: z.infer<typeof HarnessPresetIdSchema> | null;
  /** Flat keys for the one-pickup layout (`pickupR`, …), dot-separated keys for the others (`neck.pickupR`, …). */
  values: Record<string, unknown>;
  /** Measured parts whose values the design uses, by value key ({ volumeR: partId, … }). */
  partRefs: Record<string, number> | null;
  notes: string | null;
  ownerId: string | null;
  createdAt: number;
  updatedAt: number | null;
}
