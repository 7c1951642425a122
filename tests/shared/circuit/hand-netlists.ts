// Hand-written SPICE netlists of every harness preset, the independent reference for the engine
// (used by hand-netlists.test.ts without ngspice and by ngspice-agreement.test.ts with it).
// Nothing here comes from shared/circuit: the pot halves are computed from the published law, the
// part values are typed below, and each preset's wiring is written out element by element from
// its description.
//
// Pot law (B. Holmes, "Modelling logarithmic potentiometer laws", 2017): the exponential audio
// law y(x) = (b^x − 1)/(b − 1) with b = (1/y_m − 1)², where y_m = y(0.5) is the fraction of the
// track at mid-rotation. A reverse pot is the mirror image y(x) = 1 − y_audio(1 − x); here it is
// described by its own mid-rotation value y(0.5) = 1 − y_m of the mirrored audio law.
// Knob mapping: the 0–10 dial is rotation x = dial/10. A pot half never goes below 1 mΩ (the
// engine's documented end-stop clamp, which a wiper's contact resistance always exceeds).
import type { HarnessValues } from '@shared/circuit/presets';

export const POT_END_STOP = 1e-3;

/** Holmes 2017 exponential audio law, y(0.5) = ym. */
export function audioY(ym: number, x: number): number {
  const b = (1 / ym - 1) ** 2;
  return (b ** x - 1) / (b - 1);
}

/** A pot law as the test describes it: by its mid-rotation value y(0.5). */
export type HandLaw =
  { kind: 'linear' } | { kind: 'audio'; mid: number } | { kind: 'reverse'; mid: number } | { kind: 'two-segment'; mid: number };

/**
 * y(x) of a law. Two-segment: two straight tracks meeting at (0.5, y(0.5)), as many carbon audio
 * tracks are made (common practice, no published source): y = 2·mid·x up to mid-rotation, then the
 * straight line from (0.5, mid) to (1, 1).
 */
export function lawY(law: HandLaw, x: number): number {
  if (law.kind === 'linear') return x;
  if (law.kind === 'audio') return audioY(law.mid, x);
  if (law.kind === 'two-segment') return x <= 0.5 ? 2 * law.mid * x : law.mid + ((1 - law.mid) * (x - 0.5)) / 0.5;
  return 1 - audioY(1 - law.mid, 1 - x);
}

/** [wiper-to-reference-end, wiper-to-other-end] of a pot of R ohms at dial setting `dial`. */
export function potHalves(R: number, law: HandLaw, dial: number): [number, number] {
  const y = lawY(law, dial / 10);
  return [Math.max(R * y, POT_END_STOP), Math.max(R * (1 - y), POT_END_STOP)];
}

/** One set of part values, typed here, for both the hand-written netlist and the engine. */
export interface HandValues {
  label: string;
  pickupR: number;
  pickupL: number;
  pickupC: number;
  pickupRp?: number;
  volumeR: number;
  volumeLaw: HandLaw;
  toneR: number;
  toneLaw: HandLaw;
  toneC: number;
  bleedC: number;
  bleedR: number;
  floorR: number;
  secondC: number;
  /** total cable capacitance, F */
  cableC: number;
  ampR: number;
}

/**
 * The engine's `reverse` law parameter for a reverse pot whose y(0.5) is `mid`. Convention used
 * here: m = y(0.5) for every law, reverse included (the engine's convention), so the parameter is
 * the mid-rotation value itself; the halves above are still computed from the mirrored audio
 * formula, not from the engine's law.
 */
export function engineReverseM(mid: number): number {
  return mid;
}

/** A law in the engine's form (m = y(0.5) for every law). */
export function engineLaw(law: HandLaw): HarnessValues['volumeLaw'] {
  if (law.kind === 'linear') return { kind: 'linear' };
  if (law.kind === 'audio') return { kind: 'audio', m: law.mid };
  if (law.kind === 'two-segment') return { kind: 'two-segment', m: law.mid };
  return { kind: 'reverse', m: engineReverseM(law.mid) };
}

/** The same values in the engine's HarnessValues form (cable as 1 m of the total capacitance). */
export function engineValues(v: HandValues): HarnessValues {
  return {
    pickupR: v.pickupR,
    pickupL: v.pickupL,
    pickupC: v.pickupC,
    ...(v.pickupRp !== undefined ? { pickupRp: v.pickupRp } : {}),
    volumeR: v.volumeR,
    volumeLaw: engineLaw(v.volumeLaw),
    toneR: v.toneR,
    toneLaw: engineLaw(v.toneLaw),
    toneC: v.toneC,
    bleedC: v.bleedC,
    bleedR: v.bleedR,
    floorR: v.floorR,
    secondC: v.secondC,
    cableCapPerMetre: v.cableC / 3,
    cableLength: 3,
    ampR: v.ampR,
  };
}

/**
 * Value sets. HUMBUCKER: 4.4 H / 8 kΩ / 120 pF coil, 500 kΩ audio pots (y(0.5) = 0.15), 22 nF,
 * 300 pF cable, 1 MΩ amplifier; bleed 1 nF / 150 kΩ, floor 10 kΩ, second capacitor 10 nF (common
 * practice, no published source). SINGLE: 2.5 H / 6 kΩ / 100 pF with a 200 kΩ loss resistance,
 * a 250 kΩ linear volume, a 250 kΩ reverse tone pot (y(0.5) = 0.8), 47 nF, 600 pF of cable.
 * SECTION6: the figures' set of behaviours.test.ts (audio pots at y(0.5) = 0.10).
 */
export const HUMBUCKER: HandValues = {
  label: 'humbucker-like, audio pots 0.15',
  pickupR: 8000,
  pickupL: 4.4,
  pickupC: 120e-12,
  volumeR: 500000,
  volumeLaw: { kind: 'audio', mid: 0.15 },
  toneR: 500000,
  toneLaw: { kind: 'audio', mid: 0.15 },
  toneC: 22e-9,
  bleedC: 1e-9,
  bleedR: 150000,
  floorR: 10000,
  secondC: 10e-9,
  cableC: 300e-12,
  ampR: 1e6,
};

export const SINGLE: HandValues = {
  label: 'single-coil-like with loss, linear volume, reverse tone 0.8',
  pickupR: 6000,
  pickupL: 2.5,
  pickupC: 100e-12,
  pickupRp: 200000,
  volumeR: 250000,
  volumeLaw: { kind: 'linear' },
  toneR: 250000,
  toneLaw: { kind: 'reverse', mid: 0.8 },
  toneC: 47e-9,
  bleedC: 2.2e-9,
  bleedR: 220000,
  floorR: 4700,
  secondC: 4.7e-9,
  cableC: 600e-12,
  ampR: 1e6,
};

export const SECTION6: HandValues = {
  ...HUMBUCKER,
  label: 'section-6 figures, audio pots 0.10',
  volumeLaw: { kind: 'audio', mid: 0.1 },
  toneLaw: { kind: 'audio', mid: 0.1 },
};

const n = (x: number) => x.toPrecision(15);

/** Pickup, volume pot, cable and amplifier: the lines every preset shares. */
function common(v: HandValues, volume: number): string[] {
  const [low, high] = potHalves(v.volumeR, v.volumeLaw, volume);
  return [
    'V1 emf 0 DC 0 AC 1',
    `Rcoil emf coil ${n(v.pickupR)}`,
    `Lcoil coil hot ${n(v.pickupL)}`,
    `Cself hot 0 ${n(v.pickupC)}`,
    ...(v.pickupRp !== undefined ? [`Rloss hot 0 ${n(v.pickupRp)}`] : []),
    // volume pot: lug 1 on ground, lug 3 on the pickup hot, wiper to the jack
    `Rvol_low 0 out ${n(low)}`,
    `Rvol_high out hot ${n(high)}`,
    `Ccable out 0 ${n(v.cableC)}`,
    `Ramp out 0 ${n(v.ampR)}`,
  ];
}

export type HandPresetId =
  | 'independent-tone'
  | 'interactive-tone'
  | 'bleed-cap'
  | 'bleed-cap-parallel-r'
  | 'bleed-cap-series-r'
  | 'tone-floor-resistor'
  | 'dual-cap-tone';

export const HAND_PRESET_IDS: readonly HandPresetId[] = [
  'independent-tone',
  'interactive-tone',
  'bleed-cap',
  'bleed-cap-parallel-r',
  'bleed-cap-series-r',
  'tone-floor-resistor',
  'dual-cap-tone',
];

/** The netlist text of a preset at a knob setting, with an `.ac dec 50 20 20k` analysis. */
export function handNetlist(id: HandPresetId, v: HandValues, volume: number, tone: number, ac = '.ac dec 50 20 20k'): string {
  const [toneR] = potHalves(v.toneR, v.toneLaw, tone);
  const lines = [`${id} by hand (volume ${volume}, tone ${tone})`, ...common(v, volume)];
  switch (id) {
    case 'independent-tone':
      lines.push(`Rtone hot tone ${n(toneR)}`, `Ctone tone 0 ${n(v.toneC)}`);
      break;
    case 'interactive-tone':
      lines.push(`Rtone out tone ${n(toneR)}`, `Ctone tone 0 ${n(v.toneC)}`);
      break;
    case 'bleed-cap':
      lines.push(`Rtone hot tone ${n(toneR)}`, `Ctone tone 0 ${n(v.toneC)}`, `Cbleed hot out ${n(v.bleedC)}`);
      break;
    case 'bleed-cap-parallel-r':
      lines.push(
        `Rtone hot tone ${n(toneR)}`,
        `Ctone tone 0 ${n(v.toneC)}`,
        `Cbleed hot out ${n(v.bleedC)}`,
        `Rbleed hot out ${n(v.bleedR)}`,
      );
      break;
    case 'bleed-cap-series-r':
      lines.push(
        `Rtone hot tone ${n(toneR)}`,
        `Ctone tone 0 ${n(v.toneC)}`,
        `Cbleed hot bleed ${n(v.bleedC)}`,
        `Rbleed bleed out ${n(v.bleedR)}`,
      );
      break;
    case 'tone-floor-resistor':
      lines.push(`Rtone hot tone ${n(toneR)}`, `Rfloor tone low ${n(v.floorR)}`, `Ctone low 0 ${n(v.toneC)}`);
      break;
    case 'dual-cap-tone': {
      // hot enters the track at the end whose resistance to the wiper grows with the knob; the
      // rest of the track (wiper to far end) has the second capacitor across it
      const [grow, shrink] = potHalves(v.toneR, v.toneLaw, tone);
      lines.push(
        `Rtone_grow hot tone ${n(grow)}`,
        `Rtone_rest tone far ${n(shrink)}`,
        `Csecond tone far ${n(v.secondC)}`,
        `Rfloor far low ${n(v.floorR)}`,
        `Ctone low 0 ${n(v.toneC)}`,
      );
      break;
    }
  }
  lines.push(ac, '.end');
  return `${lines.join('\n')}\n`;
}

/** Knob settings (volume, tone) at which every preset is checked. */
export const HAND_SETTINGS: readonly [number, number][] = [
  [10, 10],
  [5, 10],
  [2, 7],
  [7.3, 1.1],
  [0.5, 3],
  [10, 0],
];

/**
 * Largest |ΔdB| and |Δphase|° between a reference response (complex) and the engine's simulate
 * (dB and degrees), over the points where the reference level is above −150 dB.
 */
export function difference(
  ref: readonly { re: number; im: number }[],
  engine: { magnitudeDb: ArrayLike<number>; phaseDeg: ArrayLike<number> },
): { db: number; deg: number; points: number } {
  let db = 0;
  let deg = 0;
  let points = 0;
  ref.forEach((z, k) => {
    const level = 10 * Math.log10(z.re * z.re + z.im * z.im);
    if (!(level > -150)) return;
    points++;
    db = Math.max(db, Math.abs(level - engine.magnitudeDb[k]!));
    const d = (Math.atan2(z.im, z.re) * 180) / Math.PI - engine.phaseDeg[k]!;
    deg = Math.max(deg, Math.abs(((d + 540) % 360) - 180));
  });
  return { db, deg, points };
}
