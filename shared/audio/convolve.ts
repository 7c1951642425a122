// Convolution by FFT with overlap-add (standard block convolution: T. G. Stockham, "High-speed
// convolution and correlation", AFIPS 1966 — cited from memory), and offline rendering of one or
// more source tracks through filters that change at given moments, crossfading linearly from the
// old filter's output to the new one's, as the browser does with two convolvers and two gains.
import { nextPowerOfTwo } from './fft';
import { realFft, type ImpulseResponse } from './impulse';

/** An impulse response with its spectrum for one block size, ready to convolve with. */
export interface PreparedFilter {
  ir: ImpulseResponse;
  /** FFT size: four times the response's length (rounded up to a power of two) */
  fftSize: number;
  /** input samples per block */
  block: number;
  re: Float64Array;
  im: Float64Array;
  /** The same spectrum interleaved (bin k at [2k], [2k + 1]), as the block loop reads it. */
  spec: Float64Array;
}

/**
 * Precomputes the spectrum of an impulse response for overlap-add. The FFT is four times the
 * response's length and each block fills the rest (three quarters): fewer, larger transforms than
 * blocks as long as the response (measured about a third less work per sample).
 */
export function prepareFilter(ir: ImpulseResponse): PreparedFilter {
  const fftSize = 4 * nextPowerOfTwo(ir.samples.length);
  const block = fftSize - ir.samples.length;
  const fft = realFft(fftSize);
  const re = new Float64Array(fftSize / 2 + 1);
  const im = new Float64Array(fftSize / 2 + 1);
  fft.forward(ir.samples, re, im);
  const spec = new Float64Array(2 * fftSize);
  for (let k = 0; k <= fftSize / 2; k++) {
    spec[2 * k] = re[k]!;
    spec[2 * k + 1] = im[k]!;
  }
  return { ir, fftSize, block, re, im, spec };
}

/** X[k] ← X[k]·H[k] for bins 0..N/2, both interleaved. */
function multiplySpectrum(x: Float64Array, h: Float64Array, half: number): void {
  for (let k = 0; k <= half; k++) {
    const r = 2 * k;
    const xr = x[r]!;
    const xi = x[r + 1]!;
    const hr = h[r]!;
    const hi = h[r + 1]!;
    x[r] = xr * hr - xi * hi;
    x[r + 1] = xr * hi + xi * hr;
  }
}

/**
 * out[i] += gain(i)·y[from + i + shift] for i in [0, to − from), where y = input ∗ ir and shift
 * is the filter's modelling delay (so the output is time-aligned with the input). Input outside
 * [0, input.length) counts as silence. `gain` defaults to 1.
 *
 * Work per pair of blocks: two real forward FFTs (fft.js's real transform) straight into
 * interleaved spectra, the products with H in place, and one complex inverse FFT that returns both
 * blocks (IDFT(X + jY) = x + jy), added to the output from the transform's own buffer; the FFT
 * plans and buffers are made once per size and kept.
 */
export function convolveInto(
  input: Float32Array | Float64Array,
  filter: PreparedFilter,
  out: Float32Array | Float64Array,
  from: number,
  to: number,
  gain?: (i: number) => number,
): void {
  if (to <= from) return;
  const { block, fftSize, spec: h } = filter;
  const shift = filter.ir.delay;
  const irLen = filter.ir.samples.length;
  const fft = realFft(fftSize);
  const half = fftSize / 2;
  // y[t] for t in [from + shift, to + shift) needs input from t − irLen + 1 to t
  const yStart = from + shift;
  const yEnd = to + shift;
  const firstInput = Math.max(0, yStart - irLen + 1);
  const lastInput = Math.min(input.length, yEnd); // exclusive
  if (lastInput <= firstInput) return;
  const { a, b } = scratch(fftSize);
  const add = (y: Float64Array, parity: 0 | 1, start: number) => {
    // y[2j + parity] is the full output at time start + j; keep what falls in [yStart, yEnd)
    const j0 = Math.max(0, yStart - start);
    const j1 = Math.min(fftSize, yEnd - start);
    const base = start - yStart;
    if (gain) {
      for (let j = j0; j < j1; j++) out[base + j] = out[base + j]! + gain(base + j) * y[2 * j + parity]!;
    } else {
      for (let j = j0; j < j1; j++) out[base + j] = out[base + j]! + y[2 * j + parity]!;
    }
  };
  // blocks two at a time: one complex inverse FFT returns both
  for (let start = firstInput; start < lastInput; start += 2 * block) {
    const second = start + block;
    fft.forwardInto(input, start, Math.min(second, lastInput), a);
    multiplySpectrum(a, h, half);
    const hasSecond = second < lastInput;
    if (hasSecond) {
      fft.forwardInto(input, second, Math.min(second + block, lastInput), b);
      multiplySpectrum(b, h, half);
    }
    const y = fft.inversePair(a, hasSecond ? b : null);
    add(y, 0, start);
    if (hasSecond) add(y, 1, second);
  }
}

const scratches = new Map<number, { a: Float64Array; b: Float64Array }>();
/** Two interleaved spectra per FFT size, kept between calls (the block loop is not re-entrant, and JavaScript runs it to the end). */
function scratch(size: number) {
  let s = scratches.get(size);
  if (!s) {
    s = { a: new Float64Array(2 * size), b: new Float64Array(2 * size) };
    scratches.set(size, s);
  }
  return s;
}

/** The input through one filter, time-aligned (the modelling delay taken off), as long as the input. */
export function convolve(input: Float32Array | Float64Array, ir: ImpulseResponse | PreparedFilter): Float32Array {
  const filter = 'fftSize' in ir ? ir : prepareFilter(ir);
  const out = new Float32Array(input.length);
  convolveInto(input, filter, out, 0, input.length);
  return out;
}

/**
 * One filter setting of a render: from sample `at` on, track k goes through `filters[k]` (the
 * transfer of pickup k at that setting) and the outputs are summed.
 */
export interface FilterSegment {
  at: number;
  filters: readonly (ImpulseResponse | PreparedFilter)[];
}

/** Crossfade length when a filter changes: 25 ms (the sound follows a knob within 50 ms). */
export const CROSSFADE_SECONDS = 0.025;

/**
 * Renders source tracks through filters that change over time. Each segment's filter bank takes
 * over at its `at` sample with a linear crossfade of `fadeSamples` (default 25 ms) from the
 * previous one; both outputs come from the same input, so the sum of the two gains stays 1.
 * Every track must be as long as the first; the output is as long too.
 */
export function renderSegments(
  tracks: readonly (Float32Array | Float64Array)[],
  segments: readonly FilterSegment[],
  sampleRate: number,
  fadeSamples = Math.round(CROSSFADE_SECONDS * sampleRate),
): Float32Array {
  const length = tracks[0]?.length ?? 0;
  const out = new Float32Array(length);
  const sorted = [...segments].sort((a, b) => a.at - b.at);
  sorted.forEach((seg, s) => {
    if (seg.filters.length !== tracks.length) throw new Error(`segment ${s}: ${seg.filters.length} filters for ${tracks.length} tracks`);
    const start = s === 0 ? 0 : Math.max(0, seg.at);
    const next = sorted[s + 1];
    const end = next ? Math.min(length, Math.max(start, next.at) + fadeSamples) : length;
    const fadeIn = s === 0 ? 0 : fadeSamples;
    const fadeOutStart = next ? Math.max(start, next.at) : Infinity;
    const gain = (i: number) => {
      const t = start + i;
      let g = 1;
      if (fadeIn > 0 && t < start + fadeIn) g = (t - start + 1) / (fadeIn + 1);
      if (t >= fadeOutStart && fadeSamples > 0) g *= 1 - (t - fadeOutStart + 1) / (fadeSamples + 1);
      else if (t >= fadeOutStart) g = 0;
      return g;
    };
    const slice = out.subarray(start, end);
    seg.filters.forEach((f, k) => {
      const filter = 'fftSize' in f ? f : prepareFilter(f);
      // convolveInto writes out[i] for i relative to `from`, so hand it the slice
      convolveInto(tracks[k]!, filter, slice, start, end, gain);
    });
  });
  return out;
}
