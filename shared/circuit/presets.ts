// Harness presets (docs/computation.md §6): the passive networks between a pickup and the amplifier that
// the harness page offers, each a function from a flat set of part values to a netlist.
//
// Node names used by every preset: 'hot' (pickup hot = volume pot's input end), 'out' (volume
// wiper = jack), '0' (ground). The volume pot is a = '0' (the end R·y(x) away from the wiper, i.e.
// lug 1), b = 'hot' (lug 3), w = 'out'.
import { GROUND, OUTPUT, type Netlist, type Part } from './netlist';
import type { TaperLaw } from '@shared/taper/law';
import { DEFAULT_CABLE, LOADS, loadParts } from './loads';

/** Part values of a harness, all in SI units (Ω, F, H, m, F/m) plus the two pots' laws. */
export interface HarnessValues {
  /** Pickup DC resistance, Ω */
  pickupR: number;
  /** Pickup inductance, H */
  pickupL: number;
  /** Pickup self-capacitance, F */
  pickupC: number;
  /** Pickup parallel loss resistance, Ω (absent: none) */
  pickupRp?: number;
  /** Volume pot end-to-end resistance, Ω */
  volumeR: number;
  volumeLaw: TaperLaw;
  /** Tone pot end-to-end resistance, Ω */
  toneR: number;
  toneLaw: TaperLaw;
  /** Tone capacitor, F */
  toneC: number;
  /** Treble-bleed capacitor, F */
  bleedC: number;
  /** Treble-bleed resistor, Ω */
  bleedR: number;
  /** Tone floor resistor, Ω */
  floorR: number;
  /** Second capacitor of the dual-capacitor tone network (across the shrinking part of the track), F */
  secondC: number;
  /** Cable capacitance per metre, F/m */
  cableCapPerMetre: number;
  /** Cable length, m */
  cableLength: number;
  /** Amplifier input resistance, Ω */
  ampR: number;
}

export type HarnessPresetId =
  | 'independent-tone'
  | 'interactive-tone'
  | 'bleed-cap'
  | 'bleed-cap-parallel-r'
  | 'bleed-cap-series-r'
  | 'tone-floor-resistor'
  | 'dual-cap-tone';

export interface HarnessPreset {
  id: HarnessPresetId;
  name: string;
  description: string;
  defaults: HarnessValues;
  build(values: HarnessValues): Netlist;
}

export type PickupValues = Pick<HarnessValues, 'pickupR' | 'pickupL' | 'pickupC' | 'pickupRp'>;

/**
 * Typical pickup values: common practice (no published source), from memory; the humbucker-like
 * figures are the ones docs/computation.md §6 uses for its cross-check.
 */
export const PICKUP_PRESETS: readonly { id: 'single-coil-like' | 'humbucker-like'; name: string; values: PickupValues }[] = [
  { id: 'single-coil-like', name: 'Single-coil-like pickup', values: { pickupR: 6e3, pickupL: 2.5, pickupC: 100e-12 } },
  { id: 'humbucker-like', name: 'Humbucker-like pickup', values: { pickupR: 8e3, pickupL: 4.4, pickupC: 120e-12 } },
];

/**
 * Defaults of our own choosing. Pots: 500 kΩ with the exponential audio law at m = 0.15 (the
 * mid-rotation value B. Holmes 2017 calls "quite a good approximation of a log pot"; 500 kΩ audio
 * pots are common practice (no published source)). Tone capacitor 22 nF, bleed 1 nF and 150 kΩ,
 * floor resistor 10 kΩ, second capacitor 10 nF: common practice (no published source). Cable 100 pF
 * per metre (Sound On Sound, "Guitar cables", Nov 2009: "around 30 picofarads per foot (or 100
 * picofarads per metre)") × 3 m; amplifier input 1 MΩ (Guitar World, "How impedance affects your
 * guitar tone": "most high-level amp inputs provide a load impedance around 1M").
 */
export const DEFAULT_HARNESS_VALUES: HarnessValues = {
  pickupR: 8e3,
  pickupL: 4.4,
  pickupC: 120e-12,
  volumeR: 500e3,
  volumeLaw: { kind: 'audio', m: 0.15 },
  toneR: 500e3,
  toneLaw: { kind: 'audio', m: 0.15 },
  toneC: 22e-9,
  bleedC: 1e-9,
  bleedR: 150e3,
  floorR: 10e3,
  secondC: 10e-9,
  cableCapPerMetre: DEFAULT_CABLE.capPerMetre,
  cableLength: DEFAULT_CABLE.lengthM,
  ampR: LOADS.amp.inputDefault,
};

/** Pickup, volume pot, cable and amplifier input: the parts every preset shares. */
function common(v: HarnessValues): Part[] {
  const cableC = v.cableCapPerMetre * v.cableLength;
  return [
    {
      kind: 'pickup',
      id: 'pickup',
      hot: 'hot',
      cold: GROUND,
      R: v.pickupR,
      L: v.pickupL,
      C: v.pickupC,
      ...(v.pickupRp !== undefined ? { Rp: v.pickupRp } : {}),
    },
    { kind: 'pot', id: 'volume', a: GROUND, b: 'hot', w: OUTPUT, R: v.volumeR, law: v.volumeLaw, knob: 'volume' },
    // the amplifier input and the cable, as loads.ts defines them
    ...loadParts({ id: 'amp', R: v.ampR, C: 0, cableC }),
  ];
}

/** A plain tone branch from `from`: the tone pot as a variable resistor R·y(x), then the capacitor. */
function plainTone(v: HarnessValues, from: string): Part[] {
  return [
    { kind: 'pot', id: 'tone', a: from, w: 'tone', R: v.toneR, law: v.toneLaw, knob: 'tone' },
    { kind: 'capacitor', id: 'tone-cap', a: 'tone', b: GROUND, C: v.toneC },
  ];
}

function preset(id: HarnessPresetId, name: string, description: string, build: (v: HarnessValues) => Part[]): HarnessPreset {
  return {
    id,
    name,
    description,
    defaults: { ...DEFAULT_HARNESS_VALUES },
    build: (v) => ({ title: `${name} harness`, parts: [...common(v), ...build(v)] }),
  };
}

export const HARNESS_PRESETS: readonly HarnessPreset[] = [
  preset(
    'independent-tone',
    'Independent tone',
    'Volume pot with its input end on the pickup hot and its wiper to the output; the tone pot, as a variable resistor, and the tone capacitor go from the pickup hot to ground, so the tone branch sits ahead of the volume pot.',
    (v) => plainTone(v, 'hot'),
  ),
  preset(
    'interactive-tone',
    'Interactive tone',
    'As the independent tone, but the tone branch starts at the volume wiper (the output), so the volume setting changes what the tone control does and the other way round; the tone capacitor loads the output rather than the pickup.',
    (v) => plainTone(v, OUTPUT),
  ),
  preset(
    'bleed-cap',
    'Treble bleed: capacitor',
    "Independent tone plus a capacitor from the volume pot's input end to its wiper, letting high frequencies bypass the pot as the volume is turned down.",
    (v) => [...plainTone(v, 'hot'), { kind: 'capacitor', id: 'bleed-cap', a: 'hot', b: OUTPUT, C: v.bleedC }],
  ),
  preset(
    'bleed-cap-parallel-r',
    'Treble bleed: capacitor with parallel resistor',
    "Independent tone plus a treble-bleed capacitor with a resistor in parallel, both from the volume pot's input end to its wiper.",
    (v) => [
      ...plainTone(v, 'hot'),
      { kind: 'capacitor', id: 'bleed-cap', a: 'hot', b: OUTPUT, C: v.bleedC },
      { kind: 'resistor', id: 'bleed-r', a: 'hot', b: OUTPUT, R: v.bleedR },
    ],
  ),
  preset(
    'bleed-cap-series-r',
    'Treble bleed: capacitor and resistor in series',
    "Independent tone plus a treble-bleed capacitor in series with a resistor, from the volume pot's input end to its wiper.",
    (v) => [
      ...plainTone(v, 'hot'),
      { kind: 'capacitor', id: 'bleed-cap', a: 'hot', b: 'bleed', C: v.bleedC },
      { kind: 'resistor', id: 'bleed-r', a: 'bleed', b: OUTPUT, R: v.bleedR },
    ],
  ),
  preset(
    'tone-floor-resistor',
    'Tone with floor resistor',
    'Independent tone with a fixed resistor in series with the tone pot and capacitor, so that the tone knob at 0 acts like a small setting rather than putting the capacitor straight across the pickup.',
    (v) => [
      { kind: 'pot', id: 'tone', a: 'hot', w: 'tone', R: v.toneR, law: v.toneLaw, knob: 'tone' },
      { kind: 'resistor', id: 'floor-r', a: 'tone', b: 'tone-low', R: v.floorR },
      { kind: 'capacitor', id: 'tone-cap', a: 'tone-low', b: GROUND, C: v.toneC },
    ],
  ),
  preset(
    'dual-cap-tone',
    'Dual-capacitor tone network',
    "The pickup hot enters the tone pot's track at the end whose resistance to the wiper grows as the knob turns up (full at 10). The rest of the track, from the wiper to the far end, shrinks to zero at 10 and has a second capacitor across it; from the far end a floor resistor and the tone capacitor go to ground. At 10 this is the plain tone branch (with the floor resistor); turning down brings the second capacitor in series with the tone capacitor, a smaller total capacitance and so a higher corner.",
    (v) => [
      { kind: 'pot', id: 'tone', a: 'hot', w: 'tone', b: 'tone-far', R: v.toneR, law: v.toneLaw, knob: 'tone' },
      { kind: 'capacitor', id: 'second-cap', a: 'tone', b: 'tone-far', C: v.secondC },
      { kind: 'resistor', id: 'floor-r', a: 'tone-far', b: 'tone-low', R: v.floorR },
      { kind: 'capacitor', id: 'tone-cap', a: 'tone-low', b: GROUND, C: v.toneC },
    ],
  ),
];

export function getPreset(id: HarnessPresetId | string): HarnessPreset | undefined {
  return HARNESS_PRESETS.find((p) => p.id === id);
}

export type ValueQuantity = 'resistance' | 'capacitance' | 'inductance' | 'length' | 'capacitance-per-length' | 'law';

export interface HarnessValueField {
  key: keyof HarnessValues;
  label: string;
  quantity: ValueQuantity;
  /** SI unit symbol ('' for a law) */
  unit: string;
  optional: boolean;
  /** Presets whose netlist uses the field */
  presets: readonly HarnessPresetId[];
}

const ALL: readonly HarnessPresetId[] = HARNESS_PRESETS.map((p) => p.id);
const BLEED_R: readonly HarnessPresetId[] = ['bleed-cap-parallel-r', 'bleed-cap-series-r'];

/** The value fields for an editor, in display order. */
export const HARNESS_VALUE_FIELDS: readonly HarnessValueField[] = [
  { key: 'pickupR', label: 'Pickup DC resistance', quantity: 'resistance', unit: 'Ω', optional: false, presets: ALL },
  { key: 'pickupL', label: 'Pickup inductance', quantity: 'inductance', unit: 'H', optional: false, presets: ALL },
  { key: 'pickupC', label: 'Pickup self-capacitance', quantity: 'capacitance', unit: 'F', optional: false, presets: ALL },
  { key: 'pickupRp', label: 'Pickup loss resistance (parallel)', quantity: 'resistance', unit: 'Ω', optional: true, presets: ALL },
  { key: 'volumeR', label: 'Volume pot', quantity: 'resistance', unit: 'Ω', optional: false, presets: ALL },
  { key: 'volumeLaw', label: 'Volume pot law', quantity: 'law', unit: '', optional: false, presets: ALL },
  { key: 'toneR', label: 'Tone pot', quantity: 'resistance', unit: 'Ω', optional: false, presets: ALL },
  { key: 'toneLaw', label: 'Tone pot law', quantity: 'law', unit: '', optional: false, presets: ALL },
  { key: 'toneC', label: 'Tone capacitor', quantity: 'capacitance', unit: 'F', optional: false, presets: ALL },
  {
    key: 'bleedC',
    label: 'Treble-bleed capacitor',
    quantity: 'capacitance',
    unit: 'F',
    optional: false,
    presets: ['bleed-cap', ...BLEED_R],
  },
  { key: 'bleedR', label: 'Treble-bleed resistor', quantity: 'resistance', unit: 'Ω', optional: false, presets: BLEED_R },
  {
    key: 'floorR',
    label: 'Tone floor resistor',
    quantity: 'resistance',
    unit: 'Ω',
    optional: false,
    presets: ['tone-floor-resistor', 'dual-cap-tone'],
  },
  { key: 'secondC', label: 'Second tone capacitor', quantity: 'capacitance', unit: 'F', optional: false, presets: ['dual-cap-tone'] },
  {
    key: 'cableCapPerMetre',
    label: 'Cable capacitance per metre',
    quantity: 'capacitance-per-length',
    unit: 'F/m',
    optional: false,
    presets: ALL,
  },
  { key: 'cableLength', label: 'Cable length', quantity: 'length', unit: 'm', optional: false, presets: ALL },
  { key: 'ampR', label: 'Amplifier input resistance', quantity: 'resistance', unit: 'Ω', optional: false, presets: ALL },
];
