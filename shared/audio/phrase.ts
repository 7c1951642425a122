// The built-in phrase: plucked strings synthesised with the plucked-string model of K. Karplus and
// A. Strong ("Digital synthesis of plucked-string and drum timbres", Computer Music Journal 7(2),
// 1983): a delay line one period long, filled with noise, fed back through a two-point average.
// With the extensions of D. A. Jaffe and J. O. Smith ("Extensions of the Karplus-Strong
// plucked-string algorithm", Computer Music Journal 7(2), 1983 — cited from memory): a first-order
// all-pass for the fraction of a sample the period needs (tuning), a loss factor for the decay
// time, and a comb on the excitation for the pluck position.
//
// Each pickup hears the string at its own place: the wave travelling towards the bridge comes back
// inverted after a round trip from the pickup to the bridge, p·P samples for a pickup at the
// fraction p of the scale length from the bridge and a period of P samples, so a pickup sees
// s[n] − s[n − p·P], a comb with notches at multiples of f0/p (the same reasoning as the pluck
// position in Jaffe and Smith). One track per pickup position; the harness transfer of each
// pickup is applied to its own track afterwards.
//
// Deterministic from a seed (shared/random) and with nothing but arithmetic and Math.exp/pow per
// note, so the browser and the server produce the same samples (within rounding).
import { seededRandom } from '@shared/random/seeded';

/** One note: the string (0 = lowest), the fret, the moment it is plucked (s) and its strength (0–1). */
export interface PhraseNote {
  string: number;
  fret: number;
  time: number;
  velocity: number;
}

/** Open-string pitches of a six-string instrument in standard tuning, as MIDI note numbers (E2 A2 D3 G3 B3 E4). */
export const OPEN_STRINGS: readonly number[] = [40, 45, 50, 55, 59, 64];

/**
 * The built-in phrase, our own: a slow arpeggio, a strummed chord, a short line high on the neck
 * and a low note left to ring; about 6 s with the decay.
 */
export const DEFAULT_PHRASE: readonly PhraseNote[] = [
  // arpeggio over an open E minor shape
  { string: 0, fret: 0, time: 0.05, velocity: 0.9 },
  { string: 1, fret: 2, time: 0.3, velocity: 0.7 },
  { string: 2, fret: 2, time: 0.55, velocity: 0.7 },
  { string: 3, fret: 0, time: 0.8, velocity: 0.7 },
  { string: 4, fret: 0, time: 1.2, velocity: 0.7 },
  { string: 5, fret: 0, time: 1.5, velocity: 0.8 },
  // strummed A-shape chord, low to high, 12 ms apart
  ...[0, 2, 2, 2, 0].map((fret, i) => ({ string: i + 1, fret, time: 2.1 + 0.012 * i, velocity: 0.85 })),
  // a line on the top strings
  { string: 4, fret: 5, time: 3.0, velocity: 0.8 },
  { string: 5, fret: 3, time: 3.25, velocity: 0.8 },
  { string: 5, fret: 5, time: 3.5, velocity: 0.85 },
  { string: 5, fret: 7, time: 3.75, velocity: 0.9 },
  { string: 4, fret: 8, time: 4.0, velocity: 0.8 },
  // low note to finish
  { string: 0, fret: 3, time: 4.4, velocity: 1 },
];

/** Pickup places as fractions of the scale length from the bridge: common practice, from memory (roughly 40, 100 and 160 mm of a 648 mm scale). */
export const PICKUP_POSITIONS = { bridge: 0.062, middle: 0.16, neck: 0.25 } as const;

/**
 * The seed of the built-in phrase. Any seed makes a phrase; this one is kept so that everyone hears
 * the same plucks (and the click test's control, a change without crossfade, lands on a loud sample).
 */
export const DEFAULT_PHRASE_SEED = 6;

export interface PhraseOptions {
  sampleRate: number;
  /** Where each pickup sits (fraction of the scale length from the bridge); one track each. Default: one pickup in the middle place. */
  pickupPositions?: readonly number[];
  seed?: number;
  notes?: readonly PhraseNote[];
  /** Total length in seconds (default: the last note plus 1.6 s). */
  seconds?: number;
  /** Pluck position as a fraction of the scale length from the bridge (default 0.2). */
  pluckPosition?: number;
  /** Level of the loudest sample over all tracks (default 0.25, i.e. −12 dBFS: room for a resonant peak). */
  peak?: number;
}

export interface Phrase {
  sampleRate: number;
  /** One track per pickup position, all the same length. */
  tracks: Float32Array[];
  pickupPositions: number[];
  seed: number;
}

/** Decay time to −60 dB of the lowest open string, s; higher notes decay faster (the two-point average). */
const T60 = 6;
/** Damping when a string is played again or the phrase ends: the old note fades over this time, s. */
const DAMP_SECONDS = 0.03;

function midiToHz(midi: number): number {
  return 440 * Math.pow(2, (midi - 69) / 12);
}

/**
 * One plucked note, `length` samples, observed at the bridge end of the string (before any
 * pickup comb), written into `s` from index 0.
 */
function pluck(
  s: Float64Array,
  length: number,
  f0: number,
  velocity: number,
  sampleRate: number,
  pluckPosition: number,
  random: () => number,
): void {
  const period = sampleRate / f0;
  // loop delay: N samples of line + 1/2 of the two-point average + the all-pass fraction (Jaffe and Smith)
  let n = Math.floor(period - 0.5);
  let frac = period - 0.5 - n;
  if (frac < 0.1) {
    // keep the all-pass coefficient away from 1 (a pole near z = −1 rings)
    n -= 1;
    frac += 1;
  }
  const c = (1 - frac) / (1 + frac);
  const loss = Math.exp(-6.907755278982137 / (T60 * sampleRate));
  // excitation: noise with a comb for the pluck position, softened by a one-pole low-pass
  const line = new Float64Array(n);
  const pluckDelay = Math.max(1, Math.round(pluckPosition * period));
  const noise = new Float64Array(n);
  for (let i = 0; i < n; i++) noise[i] = 2 * random() - 1;
  let lp = 0;
  const soft = 0.5 - 0.3 * velocity;
  for (let i = 0; i < n; i++) {
    const x = noise[i]! - (i >= pluckDelay ? noise[i - pluckDelay]! : 0);
    lp = (1 - soft) * x + soft * lp;
    line[i] = velocity * lp;
  }
  let mean = 0;
  for (let i = 0; i < n; i++) mean += line[i]!;
  mean /= n;
  for (let i = 0; i < n; i++) line[i]! -= mean;
  let idx = 0;
  let prev = 0; // last sample out of the line (for the two-point average)
  let apIn = 0; // all-pass state
  let apOut = 0;
  for (let t = 0; t < length; t++) {
    const out = line[idx]!;
    const avg = 0.5 * (out + prev);
    prev = out;
    // first-order all-pass: y[n] = c·x[n] + x[n−1] − c·y[n−1]
    const y = c * avg + apIn - c * apOut;
    apIn = avg;
    apOut = y;
    line[idx] = loss * y;
    idx = idx + 1 === n ? 0 : idx + 1;
    s[t] = out;
  }
}

/** The phrase's length in frames, without synthesising it (the last note plus 1.6 s of ring, unless `seconds` is given). */
export function phraseFrames(options: Pick<PhraseOptions, 'sampleRate' | 'notes' | 'seconds'>): number {
  const lastTime = (options.notes ?? DEFAULT_PHRASE).reduce((m, x) => Math.max(m, x.time), 0);
  const seconds = options.seconds ?? lastTime + 1.6;
  return Math.round(seconds * options.sampleRate);
}

/** Synthesises the phrase, one track per pickup position. */
export function synthesizePhrase(options: PhraseOptions): Phrase {
  const sampleRate = options.sampleRate;
  const positions = [...(options.pickupPositions ?? [PICKUP_POSITIONS.middle])];
  const seed = options.seed ?? DEFAULT_PHRASE_SEED;
  const notes = [...(options.notes ?? DEFAULT_PHRASE)].sort((a, b) => a.time - b.time);
  const length = phraseFrames(options);
  const tracks = positions.map(() => new Float64Array(length));
  const random = seededRandom(seed);
  const damp = Math.max(1, Math.round(DAMP_SECONDS * sampleRate));
  const pluckPosition = options.pluckPosition ?? 0.2;
  let scratch = new Float64Array(0);

  notes.forEach((note, i) => {
    const start = Math.round(note.time * sampleRate);
    if (start >= length) return;
    const again = notes.slice(i + 1).find((x) => x.string === note.string);
    const stop = Math.min(length, again ? Math.round(again.time * sampleRate) + damp : length);
    const count = stop - start;
    if (scratch.length < count) scratch = new Float64Array(count);
    const f0 = midiToHz(OPEN_STRINGS[note.string]! + note.fret);
    pluck(scratch, count, f0, note.velocity, sampleRate, pluckPosition, random);
    // damping: fade out over the last `damp` samples when the string is played again
    if (again) {
      for (let j = Math.max(0, count - damp); j < count; j++) scratch[j]! *= (count - j) / damp;
    }
    const period = sampleRate / f0;
    positions.forEach((p, k) => {
      // pickup comb s[n] − s[n − p·P], fractional delay by linear interpolation
      const d = p * period;
      const di = Math.floor(d);
      const df = d - di;
      const track = tracks[k]!;
      for (let j = 0; j < count; j++) {
        const a = j - di >= 0 ? scratch[j - di]! : 0;
        const b = j - di - 1 >= 0 ? scratch[j - di - 1]! : 0;
        track[start + j]! += scratch[j]! - ((1 - df) * a + df * b);
      }
    });
  });

  // one scale for every track, so the pickups keep their levels relative to each other
  let max = 0;
  for (const t of tracks) for (let j = 0; j < length; j++) max = Math.max(max, Math.abs(t[j]!));
  const scale = max > 0 ? (options.peak ?? 0.25) / max : 0;
  // a short fade at the very end so that the phrase loops without a step
  const tail = Math.min(length, Math.round(0.05 * sampleRate));
  return {
    sampleRate,
    tracks: tracks.map((t) => {
      const out = new Float32Array(length);
      for (let j = 0; j < length; j++) {
        const g = j >= length - tail ? (length - j) / tail : 1;
        out[j] = t[j]! * scale * g;
      }
      return out;
    }),
    pickupPositions: positions,
    seed,
  };
}

/** Where a layout's pickup sits: neck, middle and bridge by name; any other (a single pickup) in the middle place. */
export function pickupPositionOf(pickupId: string): number {
  return pickupId === 'neck' || pickupId === 'middle' || pickupId === 'bridge' ? PICKUP_POSITIONS[pickupId] : PICKUP_POSITIONS.middle;
}
