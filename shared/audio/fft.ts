// Real FFTs of one power-of-two size over the npm package fft.js (radix-4, plain JavaScript: the
// same code runs in Node and in the browser). Forward: N real samples -> bins 0..N/2 (re, im).
// Inverse: bins 0..N/2 of a Hermitian spectrum -> N real samples, scaled by 1/N, so that
// inverse(forward(x)) = x. Two inverses at once (`inverse2`) share one complex transform: the
// spectrum X + jY of two real signals x, y transforms back to x + jy.
import FFT from 'fft.js';

export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;
}

/** The smallest power of two that is at least n (n ≥ 1). */
export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

export class RealFft {
  readonly size: number;
  readonly bins: number;
  private readonly fft: FFT;
  private readonly complex: Float64Array;
  private readonly out: Float64Array;
  private readonly real: Float64Array;

  constructor(size: number) {
    if (!isPowerOfTwo(size) || size < 4) throw new Error(`FFT size must be a power of two of at least 4, not ${size}`);
    this.size = size;
    this.bins = size / 2 + 1;
    this.fft = new FFT(size);
    this.complex = new Float64Array(2 * size);
    this.out = new Float64Array(2 * size);
    this.real = new Float64Array(size);
  }

  /**
   * The spectrum of input[start, end) (zero-padded to N; input past its end counts as 0) written
   * interleaved into `spec` (length 2N): bin k at spec[2k] (re) and spec[2k + 1] (im), k = 0..N/2.
   * No copy into separate arrays: the block convolution works on this layout directly.
   */
  forwardInto(input: Float32Array | Float64Array, start: number, end: number, spec: Float64Array): void {
    const real = this.real;
    const len = Math.max(0, Math.min(end, input.length, start + this.size) - start);
    for (let i = 0; i < len; i++) real[i] = input[start + i]!;
    real.fill(0, len);
    this.fft.realTransform(spec, real);
  }

  /**
   * The inverse of one or two Hermitian half spectra in the interleaved layout of `forwardInto`, in
   * one complex transform: returns the transform's own buffer holding x[t] at 2t and y[t] at 2t + 1
   * (y = 0 without `b`), scaled by 1/N. Valid until the next call.
   */
  inversePair(a: Float64Array, b: Float64Array | null): Float64Array {
    const n = this.size;
    const c = this.complex;
    const h = n / 2;
    if (b) {
      c[0] = a[0]!;
      c[1] = b[0]!;
      c[2 * h] = a[2 * h]!;
      c[2 * h + 1] = b[2 * h]!;
      for (let k = 1; k < h; k++) {
        const xr = a[2 * k]!;
        const xi = a[2 * k + 1]!;
        const yr = b[2 * k]!;
        const yi = b[2 * k + 1]!;
        c[2 * k] = xr - yi;
        c[2 * k + 1] = xi + yr;
        c[2 * (n - k)] = xr + yi;
        c[2 * (n - k) + 1] = yr - xi;
      }
    } else {
      c[0] = a[0]!;
      c[1] = 0;
      c[2 * h] = a[2 * h]!;
      c[2 * h + 1] = 0;
      for (let k = 1; k < h; k++) {
        const xr = a[2 * k]!;
        const xi = a[2 * k + 1]!;
        c[2 * k] = xr;
        c[2 * k + 1] = xi;
        c[2 * (n - k)] = xr;
        c[2 * (n - k) + 1] = -xi;
      }
    }
    this.fft.inverseTransform(this.out, c);
    return this.out;
  }

  /** Bins 0..N/2 of the DFT X[k] = Σ x[n]·e^(−j2πkn/N) of `input` (zero-padded when shorter than N). */
  forward(input: ArrayLike<number>, re: Float64Array, im: Float64Array): void {
    const n = this.size;
    const c = this.complex;
    const len = Math.min(input.length, n);
    // fft.js reads a real input array of length N
    const real = this.out.subarray(0, n);
    for (let i = 0; i < len; i++) real[i] = input[i]!;
    real.fill(0, len);
    this.fft.realTransform(c, real);
    for (let k = 0; k <= n / 2; k++) {
      re[k] = c[2 * k]!;
      im[k] = c[2 * k + 1]!;
    }
  }

  /**
   * x[n] = (1/N)·Σ X[k]·e^(j2πkn/N) for the Hermitian spectrum given by bins 0..N/2 (the imaginary
   * parts of bins 0 and N/2 are taken as 0).
   */
  inverse(re: ArrayLike<number>, im: ArrayLike<number>, output: Float64Array): void {
    const n = this.size;
    const c = this.complex;
    const h = n / 2;
    c[0] = re[0]!;
    c[1] = 0;
    c[2 * h] = re[h]!;
    c[2 * h + 1] = 0;
    for (let k = 1; k < h; k++) {
      const r = re[k]!;
      const i = im[k]!;
      c[2 * k] = r;
      c[2 * k + 1] = i;
      c[2 * (n - k)] = r;
      c[2 * (n - k) + 1] = -i;
    }
    this.fft.inverseTransform(this.out, c);
    const o = this.out;
    for (let t = 0; t < n; t++) output[t] = o[2 * t]!;
  }

  /**
   * Two inverses in one complex transform: x from (aRe, aIm) into outA and y from (bRe, bIm) into
   * outB, both Hermitian half spectra. Uses IDFT(X + jY) = x + jy for real x and y.
   */
  inverse2(
    aRe: ArrayLike<number>,
    aIm: ArrayLike<number>,
    bRe: ArrayLike<number>,
    bIm: ArrayLike<number>,
    outA: Float64Array,
    outB: Float64Array,
  ): void {
    const n = this.size;
    const c = this.complex;
    const h = n / 2;
    // Z[k] = X[k] + jY[k]; for k > N/2, X[k] = conj X[N−k] and Y[k] = conj Y[N−k]
    c[0] = aRe[0]!;
    c[1] = bRe[0]!;
    c[2 * h] = aRe[h]!;
    c[2 * h + 1] = bRe[h]!;
    for (let k = 1; k < h; k++) {
      const xr = aRe[k]!;
      const xi = aIm[k]!;
      const yr = bRe[k]!;
      const yi = bIm[k]!;
      c[2 * k] = xr - yi;
      c[2 * k + 1] = xi + yr;
      c[2 * (n - k)] = xr + yi;
      c[2 * (n - k) + 1] = -xi + yr;
    }
    this.fft.inverseTransform(this.out, c);
    const o = this.out;
    for (let t = 0; t < n; t++) {
      outA[t] = o[2 * t]!;
      outB[t] = o[2 * t + 1]!;
    }
  }
}
