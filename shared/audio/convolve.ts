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
  return { ir, fftSize, block, re, im };
}

/**
 * out[i] += gain(i)·y[from + i + shift] for i in [0, to − from), where y = input ∗ ir and shift
 * is the filter's modelling delay (so the output is time-aligned with the input). Input outside
 * [0, input.length) counts as silence. `gain` defaults to 1.
 */
export function convolveInto(
  input: ArrayLike<number>,
  filter: PreparedFilter,
  out: Float32Array | Float64Array,
  from: number,
  to: number,
  gain?: (i: number) => number,
): void {
  if (to <= from) return;
  const { block, fftSize, re: hRe, im: hIm } = filter;
  const shift = filter.ir.delay;
  const irLen = filter.ir.samples.length;
  const fft = realFft(fftSize);
  const bins = fftSize / 2 + 1;
  // y[t] for t in [from + shift, to + shift) needs input from t − irLen + 1 to t
  const yStart = from + shift;
  const yEnd = to + shift;
  const firstInput = Math.max(0, yStart - irLen + 1);
  const lastInput = Math.min(input.length, yEnd); // exclusive
  if (lastInput <= firstInput) return;
  const buf = new Float64Array(block);
  const aRe = new Float64Array(bins);
  const aIm = new Float64Array(bins);
  const bRe = new Float64Array(bins);
  const bIm = new Float64Array(bins);
  const ya = new Float64Array(fftSize);
  const yb = new Float64Array(fftSize);
  const blockSpectrum = (start: number, re: Float64Array, im: Float64Array): boolean => {
    const end = Math.min(start + block, lastInput);
    if (end <= start) return false;
    for (let i = start; i < end; i++) buf[i - start] = input[i]!;
    buf.fill(0, end - start);
    fft.forward(buf, re, im);
    for (let k = 0; k < bins; k++) {
      const xr = re[k]!;
      const xi = im[k]!;
      re[k] = xr * hRe[k]! - xi * hIm[k]!;
      im[k] = xr * hIm[k]! + xi * hRe[k]!;
    }
    return true;
  };
  const add = (y: Float64Array, start: number) => {
    // y[j] is the full output at time start + j; keep what falls in [yStart, yEnd)
    const j0 = Math.max(0, yStart - start);
    const j1 = Math.min(fftSize, yEnd - start);
    for (let j = j0; j < j1; j++) {
      const i = start + j - yStart;
      out[i] = out[i]! + (gain ? gain(i) : 1) * y[j]!;
    }
  };
  // blocks two at a time: one complex inverse FFT returns both
  for (let start = firstInput; start < lastInput; start += 2 * block) {
    const second = start + block;
    blockSpectrum(start, aRe, aIm);
    if (blockSpectrum(second, bRe, bIm)) {
      fft.inverse2(aRe, aIm, bRe, bIm, ya, yb);
      add(ya, start);
      add(yb, second);
    } else {
      fft.inverse(aRe, aIm, ya);
      add(ya, start);
    }
  }
}

/** The input through one filter, time-aligned (the modelling delay taken off), as long as the input. */
export function convolve(input: ArrayLike<number>, ir: ImpulseResponse | PreparedFilter): Float32Array {
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
  tracks: readonly ArrayLike<number>[],
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
