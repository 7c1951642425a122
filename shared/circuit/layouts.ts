// The whole instrument: harness layouts with several pickups, a selector, coil and phase switching,
// stacked modifications and the load the instrument plays into. Each layout turns a selector
// position, a choice per option and a set of part values into one netlist for the engine.
//
// Simplifications, stated on the screen too: every pickup (or coil) is a unit source (1 V, in phase,
// or at 180° when reversed), so the sum is what the wiring does to equal signals, not what a string
// gives at different positions; there is no mutual inductance between the coils of a dual-coil
// pickup; the selector and the coil switches are ideal (a closed contact joins two nodes, an open
// one removes what it disconnects).
import { DEFAULT_HARNESS_VALUES } from './presets';
import { GROUND, OUTPUT, type Netlist, type Part, type PickupPart } from './netlist';
import { isLoadId, LOAD_IDS, LOAD_VALUES, LOADS, loadParts, loadSettingOf } from './loads';
import type { TaperLaw } from '../taper/law';

export type LayoutId = 'one-pickup' | 'two-pickups-3way' | 'three-pickups-5way' | 'dual-coil';
export const LAYOUT_IDS: readonly LayoutId[] = ['one-pickup', 'two-pickups-3way', 'three-pickups-5way', 'dual-coil'];

export type LayoutValue = number | TaperLaw;
/** Part values by key ('pickupR', 'neck.volumeR', 'north.pickupL', 'tone1.toneC' …), SI units. */
export type LayoutValues = Record<string, LayoutValue>;
/** The choice of each option by option id ('bleed' → 'cap' …). */
export type LayoutOptions = Record<string, string>;

export type LayoutQuantity = 'resistance' | 'capacitance' | 'inductance' | 'length' | 'capacitance-per-length' | 'law';

export interface LayoutValueDef {
  key: string;
  name: string;
  quantity: LayoutQuantity;
  /** SI unit symbol ('' for a law) */
  unit: string;
  /** null: absent unless given (the pickup's loss resistance) */
  default: LayoutValue | null;
  /** 'positive': > 0; 'non-negative': ≥ 0 */
  range: 'positive' | 'non-negative';
}

export interface LayoutOptionDef {
  id: string;
  name: string;
  /** The first choice is the default. */
  choices: { id: string; name: string }[];
}

export interface LayoutDef {
  id: LayoutId;
  name: string;
  description: string;
  pickups: { id: string; name: string; coils: { id: string; name: string }[] }[];
  selector: { positions: { index: number; name: string }[] };
  knobs: { id: string; name: string }[];
  options: LayoutOptionDef[];
  values: LayoutValueDef[];
}

export interface LayoutConfig {
  selector: number;
  /** every option of the layout, defaults filled in */
  options: LayoutOptions;
  /** every value of the layout, defaults filled in (an optional value left out is absent) */
  values: LayoutValues;
}

// ---- options ---------------------------------------------------------------------------------

const OPTION_DEFS = {
  bleed: {
    id: 'bleed',
    name: 'Treble bleed (on every volume)',
    choices: [
      { id: 'none', name: 'None' },
      { id: 'cap', name: 'Capacitor' },
      { id: 'cap-parallel-r', name: 'Capacitor with a parallel resistor' },
      { id: 'cap-series-r', name: 'Capacitor and resistor in series' },
    ],
  },
  toneWiring: {
    id: 'toneWiring',
    name: 'Tone wiring',
    choices: [
      { id: 'independent', name: 'Independent (tone ahead of the volume)' },
      { id: 'interactive', name: 'Interactive (tone from the volume wiper)' },
    ],
  },
  toneNetwork: {
    id: 'toneNetwork',
    name: 'Tone network',
    choices: [
      { id: 'plain', name: 'Plain (pot and capacitor)' },
      { id: 'floor-resistor', name: 'With a floor resistor' },
      { id: 'second-cap', name: 'With a second capacitor' },
      { id: 'floor-and-second-cap', name: 'Floor resistor and second capacitor' },
    ],
  },
  volumeWiring: {
    id: 'volumeWiring',
    name: 'Volume wiring',
    choices: [
      { id: 'standard', name: 'Standard (pickup to the end lug, output from the wiper)' },
      { id: 'independent', name: 'Independent (pickup to the wiper, output from the end lug)' },
    ],
  },
  phase: {
    id: 'phase',
    name: 'Phase',
    choices: [
      { id: 'in', name: 'In phase' },
      { id: 'reversed', name: 'One pickup reversed' },
    ],
  },
  tone2Serves: {
    id: 'tone2Serves',
    name: 'Second tone serves',
    choices: [
      { id: 'middle', name: 'Middle pickup' },
      { id: 'middle-bridge', name: 'Middle and bridge pickups' },
    ],
  },
  coils: {
    id: 'coils',
    name: 'Coils',
    choices: [
      { id: 'series', name: 'Series' },
      { id: 'parallel', name: 'Parallel' },
      { id: 'single', name: 'One coil' },
      { id: 'series-reversed', name: 'Series, one coil reversed' },
    ],
  },
  load: {
    id: 'load',
    name: 'Plays into',
    // loads.ts defines the loads; the first (the amplifier input) is the default
    choices: LOAD_IDS.map((id) => ({ id, name: LOADS[id].name })),
  },
} satisfies Record<string, LayoutOptionDef>;

// ---- values ----------------------------------------------------------------------------------

const key = (prefix: string, name: string) => (prefix ? `${prefix}.${name}` : name);
const label = (prefixName: string, name: string) => (prefixName ? `${prefixName}: ${name}` : name);

function r(k: string, name: string, d: number | null, range: LayoutValueDef['range'] = 'positive'): LayoutValueDef {
  return { key: k, name, quantity: 'resistance', unit: 'Ω', default: d, range };
}
function c(k: string, name: string, d: number, range: LayoutValueDef['range'] = 'positive'): LayoutValueDef {
  return { key: k, name, quantity: 'capacitance', unit: 'F', default: d, range };
}
function law(k: string, name: string, d: TaperLaw): LayoutValueDef {
  return { key: k, name, quantity: 'law', unit: '', default: d, range: 'positive' };
}

interface CoilDefaults {
  R: number;
  L: number;
  C: number;
}

function pickupValues(prefix: string, prefixName: string, d: CoilDefaults): LayoutValueDef[] {
  return [
    r(key(prefix, 'pickupR'), label(prefixName, 'DC resistance'), d.R),
    {
      key: key(prefix, 'pickupL'),
      name: label(prefixName, 'inductance'),
      quantity: 'inductance',
      unit: 'H',
      default: d.L,
      range: 'positive',
    },
    c(key(prefix, 'pickupC'), label(prefixName, 'self-capacitance'), d.C),
    r(key(prefix, 'pickupRp'), label(prefixName, 'loss resistance (parallel)'), null),
  ];
}

const D = DEFAULT_HARNESS_VALUES;

function volumeValues(prefix: string, prefixName: string): LayoutValueDef[] {
  return [
    r(key(prefix, 'volumeR'), label(prefixName, 'volume pot'), D.volumeR),
    law(key(prefix, 'volumeLaw'), label(prefixName, 'volume pot law'), D.volumeLaw),
    c(key(prefix, 'bleedC'), label(prefixName, 'treble-bleed capacitor'), D.bleedC),
    r(key(prefix, 'bleedR'), label(prefixName, 'treble-bleed resistor'), D.bleedR),
  ];
}

function toneValues(prefix: string, prefixName: string): LayoutValueDef[] {
  return [
    r(key(prefix, 'toneR'), label(prefixName, 'tone pot'), D.toneR),
    law(key(prefix, 'toneLaw'), label(prefixName, 'tone pot law'), D.toneLaw),
    c(key(prefix, 'toneC'), label(prefixName, 'tone capacitor'), D.toneC),
    r(key(prefix, 'floorR'), label(prefixName, 'tone floor resistor'), D.floorR),
    c(key(prefix, 'secondC'), label(prefixName, 'second tone capacitor'), D.secondC),
  ];
}

// Pickup defaults of our own choosing (common practice, from memory): neck pickups are wound a
// little weaker than bridge pickups, so each pickup of a layout has its own figures. The dual-coil
// pickup's two coils are alike, each half of the humbucker-like figures in series (R and L halve,
// C doubles), so series coils give back the one-pickup layout's pickup.
const NECK_2: CoilDefaults = { R: 7.2e3, L: 3.9, C: 110e-12 };
const BRIDGE_2: CoilDefaults = { R: 8.6e3, L: 4.8, C: 130e-12 };
const NECK_3: CoilDefaults = { R: 5.8e3, L: 2.3, C: 95e-12 };
const MIDDLE_3: CoilDefaults = { R: 6.0e3, L: 2.5, C: 100e-12 };
const BRIDGE_3: CoilDefaults = { R: 6.6e3, L: 2.9, C: 110e-12 };
const COIL: CoilDefaults = { R: 4e3, L: 2.2, C: 240e-12 };

// ---- layout definitions ----------------------------------------------------------------------

export const LAYOUTS: readonly LayoutDef[] = [
  {
    id: 'one-pickup',
    name: 'One pickup',
    description: 'One pickup, one volume and one tone: the networks of the presets, with any bleed and tone network stacked.',
    pickups: [{ id: 'pickup', name: 'Pickup', coils: [] }],
    selector: { positions: [{ index: 0, name: 'Pickup' }] },
    knobs: [
      { id: 'volume', name: 'Volume' },
      { id: 'tone', name: 'Tone' },
    ],
    options: [OPTION_DEFS.bleed, OPTION_DEFS.toneWiring, OPTION_DEFS.toneNetwork, OPTION_DEFS.load],
    values: [
      ...pickupValues('', 'Pickup', { R: D.pickupR, L: D.pickupL, C: D.pickupC }),
      ...volumeValues('', ''),
      ...toneValues('', ''),
      ...LOAD_VALUES,
    ],
  },
  {
    id: 'two-pickups-3way',
    name: 'Two pickups, three-way selector',
    description:
      'Neck and bridge pickups, each through its own volume and tone; the selector joins the volume outputs (neck, both, bridge).',
    pickups: [
      { id: 'neck', name: 'Neck', coils: [] },
      { id: 'bridge', name: 'Bridge', coils: [] },
    ],
    selector: {
      positions: [
        { index: 0, name: 'Neck' },
        { index: 1, name: 'Both' },
        { index: 2, name: 'Bridge' },
      ],
    },
    knobs: [
      { id: 'neck.volume', name: 'Neck volume' },
      { id: 'bridge.volume', name: 'Bridge volume' },
      { id: 'neck.tone', name: 'Neck tone' },
      { id: 'bridge.tone', name: 'Bridge tone' },
    ],
    options: [
      OPTION_DEFS.bleed,
      OPTION_DEFS.toneWiring,
      OPTION_DEFS.toneNetwork,
      OPTION_DEFS.volumeWiring,
      OPTION_DEFS.phase,
      OPTION_DEFS.load,
    ],
    values: [
      ...pickupValues('neck', 'Neck pickup', NECK_2),
      ...pickupValues('bridge', 'Bridge pickup', BRIDGE_2),
      ...volumeValues('neck', 'Neck'),
      ...volumeValues('bridge', 'Bridge'),
      ...toneValues('neck', 'Neck'),
      ...toneValues('bridge', 'Bridge'),
      ...LOAD_VALUES,
    ],
  },
  {
    id: 'three-pickups-5way',
    name: 'Three pickups, five-way selector',
    description:
      'Neck, middle and bridge pickups joined by the selector ahead of one master volume; the first tone serves the neck pickup, the second the middle one (and the bridge when chosen).',
    pickups: [
      { id: 'neck', name: 'Neck', coils: [] },
      { id: 'middle', name: 'Middle', coils: [] },
      { id: 'bridge', name: 'Bridge', coils: [] },
    ],
    selector: {
      positions: [
        { index: 0, name: 'Neck' },
        { index: 1, name: 'Neck and middle' },
        { index: 2, name: 'Middle' },
        { index: 3, name: 'Middle and bridge' },
        { index: 4, name: 'Bridge' },
      ],
    },
    knobs: [
      { id: 'volume', name: 'Volume' },
      { id: 'tone1', name: 'Tone 1 (neck)' },
      { id: 'tone2', name: 'Tone 2 (middle)' },
    ],
    options: [
      OPTION_DEFS.bleed,
      OPTION_DEFS.toneWiring,
      OPTION_DEFS.toneNetwork,
      OPTION_DEFS.phase,
      OPTION_DEFS.tone2Serves,
      OPTION_DEFS.load,
    ],
    values: [
      ...pickupValues('neck', 'Neck pickup', NECK_3),
      ...pickupValues('middle', 'Middle pickup', MIDDLE_3),
      ...pickupValues('bridge', 'Bridge pickup', BRIDGE_3),
      ...volumeValues('', 'Master'),
      ...toneValues('tone1', 'Tone 1'),
      ...toneValues('tone2', 'Tone 2'),
      ...LOAD_VALUES,
    ],
  },
  {
    id: 'dual-coil',
    name: 'Dual-coil pickup',
    description:
      'One pickup of two coils, switched in series, in parallel, to one coil, or in series with one coil reversed; one volume and one tone.',
    pickups: [
      {
        id: 'pickup',
        name: 'Pickup',
        coils: [
          { id: 'north', name: 'North coil' },
          { id: 'south', name: 'South coil' },
        ],
      },
    ],
    selector: { positions: [{ index: 0, name: 'Pickup' }] },
    knobs: [
      { id: 'volume', name: 'Volume' },
      { id: 'tone', name: 'Tone' },
    ],
    options: [OPTION_DEFS.bleed, OPTION_DEFS.toneWiring, OPTION_DEFS.toneNetwork, OPTION_DEFS.coils, OPTION_DEFS.load],
    values: [
      ...pickupValues('north', 'North coil', COIL),
      ...pickupValues('south', 'South coil', COIL),
      ...volumeValues('', ''),
      ...toneValues('', ''),
      ...LOAD_VALUES,
    ],
  },
];

export function getLayout(id: string): LayoutDef | undefined {
  return LAYOUTS.find((l) => l.id === id);
}

// ---- checking and filling a configuration ----------------------------------------------------

export interface LayoutProblem {
  /** request path: 'values.neck.pickupR', 'options.bleed', 'knobs.tone3', 'selector' */
  path: string;
  message: string;
}

function lawProblem(v: unknown): string | null {
  if (typeof v !== 'object' || v === null || !('kind' in v)) return 'Expected a taper law.';
  const l = v as { kind: unknown; m?: unknown };
  if (l.kind === 'linear') return null;
  if (l.kind !== 'audio' && l.kind !== 'reverse' && l.kind !== 'two-segment') return 'Unknown taper law.';
  if (typeof l.m !== 'number' || !(l.m > 0 && l.m < 1)) return "The law's mid-rotation value m must lie between 0 and 1.";
  return null;
}

/**
 * Checks a request's selector, options, knobs and values against the layout and fills in the
 * defaults. An unknown key, option, choice or knob is a problem (never silently dropped).
 */
export function resolveLayoutConfig(
  layout: LayoutDef,
  input: { selector?: number; options?: Record<string, string>; values?: Record<string, unknown>; knobs?: Record<string, number> },
): { config: LayoutConfig; problems: LayoutProblem[] } {
  const problems: LayoutProblem[] = [];
  const selector = input.selector ?? 0;
  if (!Number.isInteger(selector) || selector < 0 || selector >= layout.selector.positions.length) {
    problems.push({ path: 'selector', message: `This layout's selector has positions 0 to ${layout.selector.positions.length - 1}.` });
  }
  const options: LayoutOptions = {};
  for (const o of layout.options) options[o.id] = o.choices[0]!.id;
  for (const [id, choice] of Object.entries(input.options ?? {})) {
    const def = layout.options.find((o) => o.id === id);
    if (!def) problems.push({ path: `options.${id}`, message: `This layout has no option "${id}".` });
    else if (!def.choices.some((ch) => ch.id === choice))
      problems.push({ path: `options.${id}`, message: `Choose one of ${def.choices.map((ch) => ch.id).join(', ')}.` });
    else options[id] = choice;
  }
  for (const id of Object.keys(input.knobs ?? {})) {
    if (!layout.knobs.some((k) => k.id === id)) problems.push({ path: `knobs.${id}`, message: `This layout has no knob "${id}".` });
  }
  const values: LayoutValues = {};
  for (const def of layout.values) if (def.default !== null) values[def.key] = def.default;
  for (const [k, v] of Object.entries(input.values ?? {})) {
    const def = layout.values.find((d) => d.key === k);
    if (!def) {
      problems.push({ path: `values.${k}`, message: `This layout has no value "${k}".` });
      continue;
    }
    if (def.quantity === 'law') {
      const p = lawProblem(v);
      if (p) problems.push({ path: `values.${k}`, message: p });
      else values[k] = v as TaperLaw;
    } else if (typeof v !== 'number' || !Number.isFinite(v)) {
      problems.push({ path: `values.${k}`, message: 'Expected a number (SI units).' });
    } else if (def.range === 'positive' ? !(v > 0) : !(v >= 0)) {
      problems.push({ path: `values.${k}`, message: def.range === 'positive' ? 'Must be more than zero.' : 'Must not be negative.' });
    } else if (def.quantity === 'length' && v > 100) {
      problems.push({ path: `values.${k}`, message: 'At most 100 m.' });
    } else {
      values[k] = v;
    }
  }
  return { config: { selector, options, values }, problems };
}

/** Knob settings with every knob of the layout, missing ones at 10. */
export function layoutKnobs(layout: LayoutDef, knobs: Record<string, number> = {}): Record<string, number> {
  const out: Record<string, number> = {};
  for (const k of layout.knobs) out[k.id] = knobs[k.id] ?? 10;
  return out;
}

// ---- netlist builders ------------------------------------------------------------------------

const num = (v: LayoutValues, k: string): number => v[k] as number;
const lawOf = (v: LayoutValues, k: string): TaperLaw => v[k] as TaperLaw;

function pickupPart(v: LayoutValues, prefix: string, id: string, hot: string, cold: string, emf: number, group: string): PickupPart {
  const Rp = v[key(prefix, 'pickupRp')] as number | undefined;
  return {
    kind: 'pickup',
    id,
    hot,
    cold,
    R: num(v, key(prefix, 'pickupR')),
    L: num(v, key(prefix, 'pickupL')),
    C: num(v, key(prefix, 'pickupC')),
    ...(Rp !== undefined ? { Rp } : {}),
    ...(emf !== 1 ? { emf } : {}),
    ...(group !== id ? { group } : {}),
  };
}

/** A volume pot from `input` to `output` with its knob; standard: input on lug 3, output from the wiper. */
function volumeParts(v: LayoutValues, prefix: string, input: string, output: string, wiring: string): Part[] {
  const R = num(v, key(prefix, 'volumeR'));
  const l = lawOf(v, key(prefix, 'volumeLaw'));
  const knob = key(prefix, 'volume');
  return wiring === 'independent'
    ? [{ kind: 'pot', id: knob, a: GROUND, w: input, b: output, R, law: l, knob }]
    : [{ kind: 'pot', id: knob, a: GROUND, b: input, w: output, R, law: l, knob }];
}

/** The treble bleed of a volume: between its input and its output. */
function bleedParts(v: LayoutValues, prefix: string, input: string, output: string, bleed: string): Part[] {
  const C = num(v, key(prefix, 'bleedC'));
  const R = num(v, key(prefix, 'bleedR'));
  const id = (n: string) => key(prefix, n);
  switch (bleed) {
    case 'cap':
      return [{ kind: 'capacitor', id: id('bleed-cap'), a: input, b: output, C }];
    case 'cap-parallel-r':
      return [
        { kind: 'capacitor', id: id('bleed-cap'), a: input, b: output, C },
        { kind: 'resistor', id: id('bleed-r'), a: input, b: output, R },
      ];
    case 'cap-series-r':
      return [
        { kind: 'capacitor', id: id('bleed-cap'), a: input, b: id('bleed'), C },
        { kind: 'resistor', id: id('bleed-r'), a: id('bleed'), b: output, R },
      ];
    default:
      return [];
  }
}

/** A tone branch from `from` to ground; `prefix` names its values, parts and nodes, `knob` its knob. */
function toneParts(v: LayoutValues, prefix: string, knob: string, from: string, network: string): Part[] {
  const id = (n: string) => key(prefix, n);
  const R = num(v, id('toneR'));
  const l = lawOf(v, id('toneLaw'));
  const C = num(v, id('toneC'));
  const floorR = num(v, id('floorR'));
  const secondC = num(v, id('secondC'));
  switch (network) {
    case 'floor-resistor':
      return [
        { kind: 'pot', id: id('tone'), a: from, w: id('tone'), R, law: l, knob },
        { kind: 'resistor', id: id('floor-r'), a: id('tone'), b: id('tone-low'), R: floorR },
        { kind: 'capacitor', id: id('tone-cap'), a: id('tone-low'), b: GROUND, C },
      ];
    case 'second-cap':
      return [
        { kind: 'pot', id: id('tone'), a: from, w: id('tone'), b: id('tone-far'), R, law: l, knob },
        { kind: 'capacitor', id: id('second-cap'), a: id('tone'), b: id('tone-far'), C: secondC },
        { kind: 'capacitor', id: id('tone-cap'), a: id('tone-far'), b: GROUND, C },
      ];
    case 'floor-and-second-cap':
      return [
        { kind: 'pot', id: id('tone'), a: from, w: id('tone'), b: id('tone-far'), R, law: l, knob },
        { kind: 'capacitor', id: id('second-cap'), a: id('tone'), b: id('tone-far'), C: secondC },
        { kind: 'resistor', id: id('floor-r'), a: id('tone-far'), b: id('tone-low'), R: floorR },
        { kind: 'capacitor', id: id('tone-cap'), a: id('tone-low'), b: GROUND, C },
      ];
    default:
      return [
        { kind: 'pot', id: id('tone'), a: from, w: id('tone'), R, law: l, knob },
        { kind: 'capacitor', id: id('tone-cap'), a: id('tone'), b: GROUND, C },
      ];
  }
}

/** Cable and input of what the instrument plays into, at the output (loads.ts). */
function outputLoad(v: LayoutValues, load: string): Part[] {
  return loadParts(loadSettingOf(isLoadId(load) ? load : 'amp', v));
}

/** Which pickups each position of a selector joins. */
const POSITIONS_3WAY: readonly (readonly string[])[] = [['neck'], ['neck', 'bridge'], ['bridge']];
const POSITIONS_5WAY: readonly (readonly string[])[] = [['neck'], ['neck', 'middle'], ['middle'], ['middle', 'bridge'], ['bridge']];

/** The pickups a selector position joins. */
export function activePickups(layout: LayoutDef, selector: number): string[] {
  if (layout.id === 'two-pickups-3way') return [...POSITIONS_3WAY[selector]!];
  if (layout.id === 'three-pickups-5way') return [...POSITIONS_5WAY[selector]!];
  return layout.pickups.map((p) => p.id);
}

/** The netlist of a layout for a filled configuration (see resolveLayoutConfig). */
export function buildLayoutNetlist(layout: LayoutDef, config: LayoutConfig): Netlist {
  const { values: v, options: o, selector } = config;
  const bleed = o.bleed ?? 'none';
  const network = o.toneNetwork ?? 'plain';
  const interactive = o.toneWiring === 'interactive';
  const load = o.load ?? 'amp';
  const parts: Part[] = [];
  const title = `${layout.name}: ${layout.selector.positions[selector]?.name ?? ''}`;
  switch (layout.id) {
    case 'one-pickup':
    case 'dual-coil': {
      if (layout.id === 'one-pickup') {
        parts.push(pickupPart(v, '', 'pickup', 'hot', GROUND, 1, 'pickup'));
      } else {
        const coils = o.coils ?? 'series';
        if (coils === 'parallel') {
          parts.push(
            pickupPart(v, 'north', 'north', 'hot', GROUND, 1, 'pickup'),
            pickupPart(v, 'south', 'south', 'hot', GROUND, 1, 'pickup'),
          );
        } else if (coils === 'single') {
          parts.push(pickupPart(v, 'north', 'north', 'hot', GROUND, 1, 'pickup'));
        } else {
          // In series the coils' string signals add; reversing one makes them oppose.
          parts.push(
            pickupPart(v, 'north', 'north', 'coils', GROUND, 1, 'pickup'),
            pickupPart(v, 'south', 'south', 'hot', 'coils', coils === 'series-reversed' ? -1 : 1, 'pickup'),
          );
        }
      }
      parts.push(...volumeParts(v, '', 'hot', OUTPUT, 'standard'), ...outputLoad(v, load));
      parts.push(...toneParts(v, '', 'tone', interactive ? OUTPUT : 'hot', network));
      parts.push(...bleedParts(v, '', 'hot', OUTPUT, bleed));
      break;
    }
    case 'two-pickups-3way': {
      const wiring = o.volumeWiring ?? 'standard';
      for (const p of activePickups(layout, selector)) {
        const hot = `${p}.hot`;
        const emf = p === 'bridge' && o.phase === 'reversed' ? -1 : 1;
        parts.push(pickupPart(v, p, p, hot, GROUND, emf, p));
        parts.push(...volumeParts(v, p, hot, OUTPUT, wiring));
        parts.push(...toneParts(v, p, `${p}.tone`, interactive ? OUTPUT : hot, network));
        parts.push(...bleedParts(v, p, hot, OUTPUT, bleed));
      }
      parts.push(...outputLoad(v, load));
      break;
    }
    case 'three-pickups-5way': {
      const active = activePickups(layout, selector);
      for (const p of active) {
        const emf = p === 'middle' && o.phase === 'reversed' ? -1 : 1;
        parts.push(pickupPart(v, p, p, 'hot', GROUND, emf, p));
      }
      parts.push(...volumeParts(v, '', 'hot', OUTPUT, 'standard'), ...outputLoad(v, load));
      const from = interactive ? OUTPUT : 'hot';
      if (active.includes('neck')) parts.push(...toneParts(v, 'tone1', 'tone1', from, network));
      if (active.includes('middle') || (o.tone2Serves === 'middle-bridge' && active.includes('bridge'))) {
        parts.push(...toneParts(v, 'tone2', 'tone2', from, network));
      }
      parts.push(...bleedParts(v, '', 'hot', OUTPUT, bleed));
      break;
    }
  }
  return { title, parts };
}

/** The option choices of the one-pickup layout that give each preset's network. */
export const PRESET_AS_LAYOUT: Readonly<Record<string, LayoutOptions>> = {
  'independent-tone': {},
  'interactive-tone': { toneWiring: 'interactive' },
  'bleed-cap': { bleed: 'cap' },
  'bleed-cap-parallel-r': { bleed: 'cap-parallel-r' },
  'bleed-cap-series-r': { bleed: 'cap-series-r' },
  'tone-floor-resistor': { toneNetwork: 'floor-resistor' },
  'dual-cap-tone': { toneNetwork: 'floor-and-second-cap' },
};

/** The volume and tone knobs of a layout (the first of each are the sweep's default axes). */
export function volumeKnobs(layout: LayoutDef): string[] {
  return layout.knobs.filter((k) => /(^|\.)volume$/.test(k.id)).map((k) => k.id);
}
export function toneKnobs(layout: LayoutDef): string[] {
  return layout.knobs.filter((k) => /(^|\.)tone\d*$/.test(k.id)).map((k) => k.id);
}
