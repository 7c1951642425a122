// Hand-written SPICE netlists of the whole-instrument layouts, the independent reference for
// shared/circuit/layouts.ts (used by layout-hand-netlists.test.ts with the tests' own solver,
// tests/support/spice-reference.ts, and by layouts-ngspice.test.ts with ngspice).
//
// Nothing here comes from shared/circuit: each layout is written out element by element from what
// it is meant to be (the layout's description, DEVELOPERS.md "The whole instrument"), the default
// values are typed below from the layouts' published defaults, and the pot halves come from the
// published audio law (hand-netlists.ts, Holmes 2017). The model, as the layouts state it: every
// pickup or coil is a unit source (1 V, or 1 V at 180° when reversed) behind its DC resistance and
// inductance, with its self-capacitance (and loss resistance, when given) across its terminals;
// selector and coil switches are ideal (a closed contact joins two nodes, an open one removes what
// it disconnects).
import { potHalves, type HandLaw } from './hand-netlists';

export type HandLayoutId = 'one-pickup' | 'two-pickups-3way' | 'three-pickups-5way' | 'dual-coil';
export const HAND_LAYOUT_IDS: readonly HandLayoutId[] = ['one-pickup', 'two-pickups-3way', 'three-pickups-5way', 'dual-coil'];

export type HandValue = number | HandLaw;
export type HandLayoutValues = Readonly<Record<string, HandValue>>;

/** The value key of a part value: `name` alone, or `prefix.name` (DEVELOPERS.md, "The whole instrument"). */
const k = (prefix: string, name: string) => (prefix ? `${prefix}.${name}` : name);

// ---- the layouts' defaults, typed by hand ------------------------------------------------------
// The product's own defaults (layouts.ts and loads.ts state them: common practice, no published
// source): 500 kΩ audio pots at y(0.5) = 0.15, 22 nF tone capacitor, a 1 nF / 150 kΩ bleed, a 10 kΩ
// floor resistor, a 10 nF second capacitor; 100 pF/m of cable, 3 m of it (also before a buffer),
// a 1 MΩ amplifier input without capacitance, a 1 MΩ buffer, a 10 kΩ low-impedance pedal input.

const AUDIO_15: HandLaw = { kind: 'audio', mid: 0.15 };

function coil(prefix: string, R: number, L: number, C: number): Record<string, HandValue> {
  return { [k(prefix, 'pickupR')]: R, [k(prefix, 'pickupL')]: L, [k(prefix, 'pickupC')]: C };
}
function volume(prefix: string): Record<string, HandValue> {
  return { [k(prefix, 'volumeR')]: 500e3, [k(prefix, 'volumeLaw')]: AUDIO_15, [k(prefix, 'bleedC')]: 1e-9, [k(prefix, 'bleedR')]: 150e3 };
}
function tone(prefix: string): Record<string, HandValue> {
  return {
    [k(prefix, 'toneR')]: 500e3,
    [k(prefix, 'toneLaw')]: AUDIO_15,
    [k(prefix, 'toneC')]: 22e-9,
    [k(prefix, 'floorR')]: 10e3,
    [k(prefix, 'secondC')]: 10e-9,
  };
}
const LOAD: Record<string, HandValue> = {
  cableCapPerMetre: 100e-12,
  cableLength: 3,
  ampR: 1e6,
  ampC: 0,
  bufferR: 1e6,
  cableBeforeBuffer: 3,
  pedalR: 10e3,
};

/**
 * Every value of each layout with its default. Pickups: one pickup 8 kΩ / 4.4 H / 120 pF; two
 * pickups: neck 7.2 kΩ / 3.9 H / 110 pF, bridge 8.6 kΩ / 4.8 H / 130 pF; three pickups: neck
 * 5.8 kΩ / 2.3 H / 95 pF, middle 6.0 kΩ / 2.5 H / 100 pF, bridge 6.6 kΩ / 2.9 H / 110 pF; dual
 * coil: two alike coils of 4 kΩ / 2.2 H / 240 pF (half of the one pickup's R and L, twice its C).
 * The loss resistances (`pickupRp`) have no default: absent unless given.
 */
export const HAND_LAYOUT_DEFAULTS: Readonly<Record<HandLayoutId, HandLayoutValues>> = {
  'one-pickup': { ...coil('', 8000, 4.4, 120e-12), ...volume(''), ...tone(''), ...LOAD },
  'two-pickups-3way': {
    ...coil('neck', 7200, 3.9, 110e-12),
    ...coil('bridge', 8600, 4.8, 130e-12),
    ...volume('neck'),
    ...volume('bridge'),
    ...tone('neck'),
    ...tone('bridge'),
    ...LOAD,
  },
  'three-pickups-5way': {
    ...coil('neck', 5800, 2.3, 95e-12),
    ...coil('middle', 6000, 2.5, 100e-12),
    ...coil('bridge', 6600, 2.9, 110e-12),
    ...volume(''),
    ...tone('tone1'),
    ...tone('tone2'),
    ...LOAD,
  },
  'dual-coil': { ...coil('north', 4000, 2.2, 240e-12), ...coil('south', 4000, 2.2, 240e-12), ...volume(''), ...tone(''), ...LOAD },
};

/** The options of each layout and their choices, the first being the default (DEVELOPERS.md). */
const BLEED = ['none', 'cap', 'cap-parallel-r', 'cap-series-r'];
const TONE_WIRING = ['independent', 'interactive'];
const TONE_NETWORK = ['plain', 'floor-resistor', 'second-cap', 'floor-and-second-cap'];
const LOADS = ['amp', 'buffer', 'low-impedance-pedal'];
export const HAND_LAYOUT_OPTIONS: Readonly<Record<HandLayoutId, Readonly<Record<string, readonly string[]>>>> = {
  'one-pickup': { bleed: BLEED, toneWiring: TONE_WIRING, toneNetwork: TONE_NETWORK, load: LOADS },
  'two-pickups-3way': {
    bleed: BLEED,
    toneWiring: TONE_WIRING,
    toneNetwork: TONE_NETWORK,
    volumeWiring: ['standard', 'independent'],
    phase: ['in', 'reversed'],
    load: LOADS,
  },
  'three-pickups-5way': {
    bleed: BLEED,
    toneWiring: TONE_WIRING,
    toneNetwork: TONE_NETWORK,
    phase: ['in', 'reversed'],
    tone2Serves: ['middle', 'middle-bridge'],
    load: LOADS,
  },
  'dual-coil': {
    bleed: BLEED,
    toneWiring: TONE_WIRING,
    toneNetwork: TONE_NETWORK,
    coils: ['series', 'parallel', 'single', 'series-reversed'],
    load: LOADS,
  },
};

/** The pickups each selector position joins, from the positions' names. */
export const HAND_POSITIONS: Readonly<Record<HandLayoutId, readonly (readonly string[])[]>> = {
  'one-pickup': [['pickup']],
  // neck, both, bridge
  'two-pickups-3way': [['neck'], ['neck', 'bridge'], ['bridge']],
  // neck, neck and middle, middle, middle and bridge, bridge
  'three-pickups-5way': [['neck'], ['neck', 'middle'], ['middle'], ['middle', 'bridge'], ['bridge']],
  'dual-coil': [['pickup']],
};

/** The knobs of each layout (DEVELOPERS.md: a knob left out is at 10). */
export const HAND_LAYOUT_KNOBS: Readonly<Record<HandLayoutId, readonly string[]>> = {
  'one-pickup': ['volume', 'tone'],
  'two-pickups-3way': ['neck.volume', 'bridge.volume', 'neck.tone', 'bridge.tone'],
  'three-pickups-5way': ['volume', 'tone1', 'tone2'],
  'dual-coil': ['volume', 'tone'],
};

// ---- element lines ---------------------------------------------------------------------------

const n = (x: number) => x.toPrecision(15);

type Values = Readonly<Record<string, HandValue>>;
const num = (v: Values, key: string): number => v[key] as number;
const lawOf = (v: Values, key: string): HandLaw => v[key] as HandLaw;

/**
 * A pickup or coil: its EMF (AC 1, or AC 1 180 when reversed; AC 0 when silenced, for one source's
 * own transfer by superposition) in series with R and L from `cold` to `hot`, C (and Rp) across.
 */
function pickup(name: string, v: Values, prefix: string, hot: string, cold: string, reversed: boolean, live: boolean): string[] {
  const Rp = v[k(prefix, 'pickupRp')] as number | undefined;
  return [
    `V${name} e_${name} ${cold} DC 0 AC ${live ? 1 : 0}${reversed ? ' 180' : ''}`,
    `R${name} e_${name} c_${name} ${n(num(v, k(prefix, 'pickupR')))}`,
    `L${name} c_${name} ${hot} ${n(num(v, k(prefix, 'pickupL')))}`,
    `C${name} ${hot} ${cold} ${n(num(v, k(prefix, 'pickupC')))}`,
    ...(Rp !== undefined ? [`R${name}_loss ${hot} ${cold} ${n(Rp)}`] : []),
  ];
}

/** Volume pot, standard: lug 1 on ground, lug 3 on the pickup (`input`), the wiper to `output`. */
function standardVolume(name: string, v: Values, prefix: string, dial: number, input: string, output: string): string[] {
  const [toLug1, toLug3] = potHalves(num(v, k(prefix, 'volumeR')), lawOf(v, k(prefix, 'volumeLaw')), dial);
  return [`R${name}_lug1 ${output} 0 ${n(toLug1)}`, `R${name}_lug3 ${output} ${input} ${n(toLug3)}`];
}

/** Volume pot, independent: lug 1 on ground, the pickup (`input`) on the wiper, lug 3 to `output`. */
function independentVolume(name: string, v: Values, prefix: string, dial: number, input: string, output: string): string[] {
  const [toLug1, toLug3] = potHalves(num(v, k(prefix, 'volumeR')), lawOf(v, k(prefix, 'volumeLaw')), dial);
  return [`R${name}_lug1 ${input} 0 ${n(toLug1)}`, `R${name}_lug3 ${input} ${output} ${n(toLug3)}`];
}

/**
 * A tone branch from `from` to ground. The pot is a variable resistor from `from` to its wiper (the
 * part of the track that grows with the knob: all of it at 10, the end stop at 0), then the tone
 * capacitor to ground; a floor resistor goes in series before the capacitor; a second capacitor
 * sits across the rest of the track (wiper to the far lug), which then leads on to the capacitor.
 */
function toneBranch(name: string, v: Values, prefix: string, dial: number, from: string, network: string): string[] {
  const [grow, rest] = potHalves(num(v, k(prefix, 'toneR')), lawOf(v, k(prefix, 'toneLaw')), dial);
  const C = n(num(v, k(prefix, 'toneC')));
  const floorR = n(num(v, k(prefix, 'floorR')));
  const secondC = n(num(v, k(prefix, 'secondC')));
  const w = `${name}_w`;
  const far = `${name}_far`;
  const low = `${name}_low`;
  switch (network) {
    case 'plain':
      return [`R${name} ${from} ${w} ${n(grow)}`, `C${name} ${w} 0 ${C}`];
    case 'floor-resistor':
      return [`R${name} ${from} ${w} ${n(grow)}`, `R${name}_floor ${w} ${low} ${floorR}`, `C${name} ${low} 0 ${C}`];
    case 'second-cap':
      return [
        `R${name} ${from} ${w} ${n(grow)}`,
        `R${name}_rest ${w} ${far} ${n(rest)}`,
        `C${name}_second ${w} ${far} ${secondC}`,
        `C${name} ${far} 0 ${C}`,
      ];
    case 'floor-and-second-cap':
      return [
        `R${name} ${from} ${w} ${n(grow)}`,
        `R${name}_rest ${w} ${far} ${n(rest)}`,
        `C${name}_second ${w} ${far} ${secondC}`,
        `R${name}_floor ${far} ${low} ${floorR}`,
        `C${name} ${low} 0 ${C}`,
      ];
    default:
      throw new Error(`hand-layout-netlists: no tone network "${network}"`);
  }
}

/** A treble bleed between a volume's input (the pickup side) and its output. */
function bleed(name: string, v: Values, prefix: string, input: string, output: string, kind: string): string[] {
  const C = n(num(v, k(prefix, 'bleedC')));
  const R = n(num(v, k(prefix, 'bleedR')));
  switch (kind) {
    case 'none':
      return [];
    case 'cap':
      return [`C${name} ${input} ${output} ${C}`];
    case 'cap-parallel-r':
      return [`C${name} ${input} ${output} ${C}`, `R${name} ${input} ${output} ${R}`];
    case 'cap-series-r':
      return [`C${name} ${input} ${name}_mid ${C}`, `R${name} ${name}_mid ${output} ${R}`];
    default:
      throw new Error(`hand-layout-netlists: no bleed "${kind}"`);
  }
}

/**
 * What the output plays into (loads.ts describes it; common practice, no published source): an
 * amplifier input (R, and its capacitance when above 0) after the whole cable; a buffered pedal
 * (R), where only the cable before the buffer loads the pickup; a low-impedance pedal input (R)
 * after the whole cable. No cable (0 m) is no capacitor.
 */
function load(v: Values, kind: string): string[] {
  const perMetre = num(v, 'cableCapPerMetre');
  const cable = (m: number) => (perMetre * m > 0 ? [`Ccable out 0 ${n(perMetre * m)}`] : []);
  switch (kind) {
    case 'amp':
      return [
        ...cable(num(v, 'cableLength')),
        `Ramp out 0 ${n(num(v, 'ampR'))}`,
        ...(num(v, 'ampC') > 0 ? [`Camp out 0 ${n(num(v, 'ampC'))}`] : []),
      ];
    case 'buffer':
      return [...cable(num(v, 'cableBeforeBuffer')), `Rbuffer out 0 ${n(num(v, 'bufferR'))}`];
    case 'low-impedance-pedal':
      return [...cable(num(v, 'cableLength')), `Rpedal out 0 ${n(num(v, 'pedalR'))}`];
    default:
      throw new Error(`hand-layout-netlists: no load "${kind}"`);
  }
}

// ---- cases -----------------------------------------------------------------------------------

/** One layout configuration: what the engine is given (options and values left out take their defaults). */
export interface HandLayoutCase {
  label: string;
  layoutId: HandLayoutId;
  selector: number;
  /** the choices given (the others at their first choice) */
  options: Readonly<Record<string, string>>;
  /** the values given, laws in the tests' form (the others at their defaults) */
  values: HandLayoutValues;
  /** three or more knob settings; a knob left out is at 10 */
  knobs: readonly Readonly<Record<string, number>>[];
}

/**
 * The netlist text of a case at one knob setting, `.ac dec 50 20 20k`. `live`: the sources (pickup
 * or coil names) left on; the others are silenced (AC 0), which gives their sum's own transfer.
 */
export function handLayoutNetlist(c: HandLayoutCase, knobs: Readonly<Record<string, number>>, live?: readonly string[]): string {
  const v: Values = { ...HAND_LAYOUT_DEFAULTS[c.layoutId], ...c.values };
  const o = (id: string) => c.options[id] ?? HAND_LAYOUT_OPTIONS[c.layoutId][id]![0]!;
  const dial = (knob: string) => knobs[knob] ?? 10;
  const on = (source: string) => !live || live.includes(source);
  const interactive = o('toneWiring') === 'interactive';
  const lines = [`${c.label} by hand ${JSON.stringify(knobs)}`];
  switch (c.layoutId) {
    case 'one-pickup':
      lines.push(
        ...pickup('pickup', v, '', 'hot', '0', false, on('pickup')),
        ...standardVolume('vol', v, '', dial('volume'), 'hot', 'out'),
        ...toneBranch('tone', v, '', dial('tone'), interactive ? 'out' : 'hot', o('toneNetwork')),
        ...bleed('bleed', v, '', 'hot', 'out', o('bleed')),
        ...load(v, o('load')),
      );
      break;
    case 'dual-coil': {
      // series: north from ground to the join, south from the join to the hot; parallel: both from
      // ground to the hot; one coil: the north coil alone (the south one open); series with the
      // south coil reversed: as series, the south EMF at 180°.
      const coils = o('coils');
      if (coils === 'series' || coils === 'series-reversed') {
        lines.push(
          ...pickup('north', v, 'north', 'join', '0', false, on('north')),
          ...pickup('south', v, 'south', 'hot', 'join', coils === 'series-reversed', on('south')),
        );
      } else if (coils === 'parallel') {
        lines.push(
          ...pickup('north', v, 'north', 'hot', '0', false, on('north')),
          ...pickup('south', v, 'south', 'hot', '0', false, on('south')),
        );
      } else if (coils === 'single') {
        lines.push(...pickup('north', v, 'north', 'hot', '0', false, on('north')));
      } else throw new Error(`hand-layout-netlists: no coil switching "${coils}"`);
      lines.push(
        ...standardVolume('vol', v, '', dial('volume'), 'hot', 'out'),
        ...toneBranch('tone', v, '', dial('tone'), interactive ? 'out' : 'hot', o('toneNetwork')),
        ...bleed('bleed', v, '', 'hot', 'out', o('bleed')),
        ...load(v, o('load')),
      );
      break;
    }
    case 'two-pickups-3way': {
      // Each pickup has its own volume (and bleed) and tone; the selector joins the volume outputs,
      // so a pickup left out takes its volume and tone with it. "One pickup reversed": the bridge.
      // Interactive tone: the tone branch starts at the volume's output side (the joined output).
      for (const p of HAND_POSITIONS[c.layoutId][c.selector]!) {
        const hot = `${p}_hot`;
        lines.push(...pickup(p, v, p, hot, '0', p === 'bridge' && o('phase') === 'reversed', on(p)));
        const vol = o('volumeWiring') === 'independent' ? independentVolume : standardVolume;
        lines.push(
          ...vol(`${p}_vol`, v, p, dial(`${p}.volume`), hot, 'out'),
          ...toneBranch(`${p}_tone`, v, p, dial(`${p}.tone`), interactive ? 'out' : hot, o('toneNetwork')),
          ...bleed(`${p}_bleed`, v, p, hot, 'out', o('bleed')),
        );
      }
      lines.push(...load(v, o('load')));
      break;
    }
    case 'three-pickups-5way': {
      // The selector joins the pickups' hots ahead of one master volume. Tone 1 serves the neck
      // pickup, tone 2 the middle one (and the bridge when so chosen): a tone is connected when a
      // pickup it serves is selected. "One pickup reversed": the middle.
      const active = HAND_POSITIONS[c.layoutId][c.selector]!;
      for (const p of active) lines.push(...pickup(p, v, p, 'hot', '0', p === 'middle' && o('phase') === 'reversed', on(p)));
      lines.push(...standardVolume('vol', v, '', dial('volume'), 'hot', 'out'));
      const from = interactive ? 'out' : 'hot';
      if (active.includes('neck')) lines.push(...toneBranch('tone1', v, 'tone1', dial('tone1'), from, o('toneNetwork')));
      const tone2 = active.includes('middle') || (o('tone2Serves') === 'middle-bridge' && active.includes('bridge'));
      if (tone2) lines.push(...toneBranch('tone2', v, 'tone2', dial('tone2'), from, o('toneNetwork')));
      lines.push(...bleed('bleed', v, '', 'hot', 'out', o('bleed')), ...load(v, o('load')));
      break;
    }
  }
  lines.push('.ac dec 50 20 20k', '.end');
  return `${lines.join('\n')}\n`;
}

// Values other than the defaults, typed here (common practice, no published source): loss
// resistances, other laws (linear, reverse, two-segment), and values that differ from pickup to
// pickup and from tone to tone, so that a value read under the wrong key shows.
const LINEAR: HandLaw = { kind: 'linear' };
export const HAND_LAYOUT_OTHER_VALUES: Readonly<Record<HandLayoutId, HandLayoutValues>> = {
  'one-pickup': {
    pickupR: 6000,
    pickupL: 2.5,
    pickupC: 100e-12,
    pickupRp: 200e3,
    volumeR: 250e3,
    volumeLaw: LINEAR,
    bleedC: 2.2e-9,
    bleedR: 220e3,
    toneR: 250e3,
    toneLaw: { kind: 'reverse', mid: 0.8 },
    toneC: 47e-9,
    floorR: 4700,
    secondC: 4.7e-9,
    cableCapPerMetre: 120e-12,
    cableLength: 4.5,
    ampR: 470e3,
    ampC: 150e-12,
    bufferR: 2.2e6,
    cableBeforeBuffer: 0.5,
    pedalR: 22e3,
  },
  'two-pickups-3way': {
    'neck.pickupRp': 150e3,
    'bridge.pickupL': 5.3,
    'neck.volumeLaw': LINEAR,
    'bridge.volumeR': 250e3,
    'neck.bleedC': 680e-12,
    'bridge.bleedC': 2.2e-9,
    'neck.bleedR': 100e3,
    'bridge.bleedR': 330e3,
    'neck.toneC': 47e-9,
    'bridge.toneC': 15e-9,
    'bridge.toneLaw': { kind: 'two-segment', mid: 0.2 },
    'neck.toneR': 250e3,
    'neck.floorR': 6800,
    'bridge.floorR': 22e3,
    'neck.secondC': 3.3e-9,
    'bridge.secondC': 6.8e-9,
    cableLength: 6,
    ampC: 100e-12,
    pedalR: 4700,
  },
  'three-pickups-5way': {
    'middle.pickupRp': 180e3,
    'bridge.pickupC': 150e-12,
    volumeR: 250e3,
    volumeLaw: { kind: 'audio', mid: 0.1 },
    bleedC: 470e-12,
    bleedR: 120e3,
    'tone1.toneC': 47e-9,
    'tone2.toneC': 15e-9,
    'tone2.toneLaw': LINEAR,
    'tone1.toneR': 250e3,
    'tone1.floorR': 6800,
    'tone2.floorR': 15e3,
    'tone1.secondC': 3.3e-9,
    'tone2.secondC': 6.8e-9,
    cableCapPerMetre: 80e-12,
    cableBeforeBuffer: 1.5,
    bufferR: 3.3e6,
  },
  'dual-coil': {
    'south.pickupR': 4500,
    'south.pickupL': 2.6,
    'south.pickupC': 200e-12,
    'north.pickupRp': 300e3,
    volumeLaw: { kind: 'two-segment', mid: 0.12 },
    toneLaw: LINEAR,
    toneC: 33e-9,
    secondC: 2.2e-9,
    cableLength: 0,
    ampR: 680e3,
  },
};

/**
 * Knob settings per layout: all at 10, a mixed setting (every knob different), one with knobs at
 * their end stops, and one naming a single knob (the others at 10).
 */
export const HAND_LAYOUT_SETTINGS: Readonly<Record<HandLayoutId, readonly Readonly<Record<string, number>>[]>> = {
  'one-pickup': [{ volume: 10, tone: 10 }, { volume: 5, tone: 3 }, { volume: 0, tone: 0 }, { tone: 6.4 }],
  'dual-coil': [{ volume: 10, tone: 10 }, { volume: 2.5, tone: 8.6 }, { volume: 0, tone: 0 }, { volume: 7.1 }],
  'two-pickups-3way': [
    { 'neck.volume': 10, 'bridge.volume': 10, 'neck.tone': 10, 'bridge.tone': 10 },
    { 'neck.volume': 5, 'bridge.volume': 7.5, 'neck.tone': 2, 'bridge.tone': 9 },
    { 'neck.volume': 0, 'bridge.volume': 3.3, 'neck.tone': 10, 'bridge.tone': 0 },
    { 'bridge.volume': 6.2 },
  ],
  'three-pickups-5way': [
    { volume: 10, tone1: 10, tone2: 10 },
    { volume: 4, tone1: 2, tone2: 7 },
    { volume: 0.6, tone1: 0, tone2: 10 },
    { tone2: 1.5 },
  ],
};

/**
 * The cases of every layout: every selector position with the default options, with the default
 * options and the other values, with every option at its last choice, and with a mixed choice per
 * option; and each non-default choice of each option alone, at every position (the five-way
 * selector: at the positions that join two pickups and at the bridge alone, where the phase and
 * the second tone's service show).
 */
export function handLayoutCases(): HandLayoutCase[] {
  const cases: HandLayoutCase[] = [];
  for (const id of HAND_LAYOUT_IDS) {
    const options = Object.entries(HAND_LAYOUT_OPTIONS[id]);
    const knobs = HAND_LAYOUT_SETTINGS[id];
    HAND_POSITIONS[id].forEach((_, selector) => {
      const add = (what: string, opts: Record<string, string>, values: HandLayoutValues = {}) =>
        cases.push({ label: `${id} position ${selector}, ${what}`, layoutId: id, selector, options: opts, values, knobs });
      add('default options', {});
      add('default options, other values', {}, HAND_LAYOUT_OTHER_VALUES[id]);
      if (id !== 'three-pickups-5way' || selector === 1 || selector >= 3) {
        for (const [option, choices] of options) {
          for (const choice of choices.slice(1)) {
            add(`${option} ${choice}`, { [option]: choice });
            // which pickup or coil is switched shows best with unlike ones
            if (option === 'coils' || option === 'phase')
              add(`${option} ${choice}, other values`, { [option]: choice }, HAND_LAYOUT_OTHER_VALUES[id]);
          }
        }
      }
      add('every option at its last choice', Object.fromEntries(options.map(([o, ch]) => [o, ch.at(-1)!])), HAND_LAYOUT_OTHER_VALUES[id]);
      const mixed = Object.fromEntries(options.map(([o, ch], i) => [o, ch[(selector + i + 1) % ch.length]!]));
      add(`mixed ${JSON.stringify(mixed)}`, mixed, HAND_LAYOUT_OTHER_VALUES[id]);
    });
  }
  return cases;
}

// ---- netlists written out whole ----------------------------------------------------------------
// Four configurations written out line by line as whole text (no helper above): linear pots at
// knob 5 are two 250 kΩ halves; at 10 the near half is the 1 mΩ end stop, written 1m.

export interface WrittenOutNetlist {
  label: string;
  text: string;
  layoutId: HandLayoutId;
  selector: number;
  options: Record<string, string>;
  /** values given to the engine, laws in the tests' form */
  values: HandLayoutValues;
  knobs: Record<string, number>;
  /** the output cancels: every point is compared as a complex value with the absolute floor */
  cancels?: boolean;
}

const TWO_PICKUPS_REVERSED = `two pickups in both, bridge reversed
Vneck en 0 DC 0 AC 1
Rneck en cn 7200
Lneck cn nh 3.9
Cneck nh 0 110p
Vbridge eb 0 DC 0 AC 1 180
Rbridge eb cb 8600
Lbridge cb bh 4.8
Cbridge bh 0 130p
* neck volume: lug 3 on the pickup, wiper to the output, linear at 5
Rnv1 0 out 250k
Rnv2 out nh 250k
* bridge volume at 10 (audio law: all of it to ground, the clamp between lug 3 and wiper)
Rbv1 0 out 500k
Rbv2 out bh 1m
* tones at 10 (audio law) from each pickup hot
Rnt nh nt 500k
Cnt nt 0 22n
Rbt bh bt 500k
Cbt bt 0 22n
Ccable out 0 300p
Ramp out 0 1meg
.ac dec 50 20 20k
.end
`;

const DUAL_COIL_SERIES_REVERSED = `dual coil, series, south reversed
Vnorth en 0 DC 0 AC 1
Rnorth en cn 4000
Lnorth cn mid 2.2
Cnorth mid 0 240p
Vsouth es mid DC 0 AC 1 180
Rsouth es cs 4000
Lsouth cs hot 2.2
Csouth hot mid 240p
Rv1 0 out 500k
Rv2 out hot 1m
Rt hot t 500k
Ct t 0 22n
Ccable out 0 300p
Ramp out 0 1meg
.ac dec 50 20 20k
.end
`;

const THREE_PICKUPS_PEDAL = `three pickups, middle and bridge
Vmid em 0 DC 0 AC 1
Rmid em cm 6000
Lmid cm hot 2.5
Cmid hot 0 100p
Vbr eb 0 DC 0 AC 1
Rbr eb cb 6600
Lbr cb hot 2.9
Cbr hot 0 110p
* master volume linear at 5
Rv1 0 out 250k
Rv2 out hot 250k
* tone 2 from the wiper (interactive), at 10
Rt out t 500k
Ct t 0 22n
Ccable out 0 300p
Rpedal out 0 10k
.ac dec 50 20 20k
.end
`;

const ONE_PICKUP_BUFFER = `one pickup into a buffer after 1 m of cable
V1 e 0 DC 0 AC 1
Rp e c 8000
Lp c hot 4.4
Cp hot 0 120p
Rv1 0 out 500k
Rv2 out hot 1m
Rt hot t 500k
Ct t 0 22n
Ccable out 0 100p
Rbuf out 0 1meg
.ac dec 50 20 20k
.end
`;

const ONE_PICKUP_AMP_C = `one pickup into an amplifier with 150 pF of input capacitance after 3 m of cable
V1 e 0 DC 0 AC 1
Rp e c 8000
Lp c hot 4.4
Cp hot 0 120p
Rv1 0 out 500k
Rv2 out hot 1m
Rt hot t 500k
Ct t 0 22n
Ccable out 0 300p
Ramp out 0 1meg
Camp out 0 150p
.ac dec 50 20 20k
.end
`;

export const WRITTEN_OUT_NETLISTS: readonly WrittenOutNetlist[] = [
  {
    label: 'two pickups, both, bridge reversed, neck volume 5 (linear), bridge volume 10, tones at 10',
    text: TWO_PICKUPS_REVERSED,
    layoutId: 'two-pickups-3way',
    selector: 1,
    options: { phase: 'reversed' },
    values: { 'neck.volumeLaw': LINEAR },
    knobs: { 'neck.volume': 5 },
  },
  {
    label: 'dual-coil, series with one coil reversed: identical coils cancel',
    text: DUAL_COIL_SERIES_REVERSED,
    layoutId: 'dual-coil',
    selector: 0,
    options: { coils: 'series-reversed' },
    values: {},
    knobs: {},
    cancels: true,
  },
  {
    label: 'three pickups, middle and bridge, tone 2 serving both, interactive, into a low-impedance pedal',
    text: THREE_PICKUPS_PEDAL,
    layoutId: 'three-pickups-5way',
    selector: 3,
    options: { tone2Serves: 'middle-bridge', toneWiring: 'interactive', load: 'low-impedance-pedal' },
    values: { volumeLaw: LINEAR },
    knobs: { volume: 5 },
  },
  {
    label: 'one pickup into a buffer: only the 1 m of cable before it loads the pickup',
    text: ONE_PICKUP_BUFFER,
    layoutId: 'one-pickup',
    selector: 0,
    options: { load: 'buffer' },
    values: { cableBeforeBuffer: 1 },
    knobs: {},
  },
  {
    label: 'one pickup into an amplifier: its input capacitance adds to the cable',
    text: ONE_PICKUP_AMP_C,
    layoutId: 'one-pickup',
    selector: 0,
    options: {},
    values: { ampC: 150e-12 },
    knobs: {},
  },
];
