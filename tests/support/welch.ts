// Welch's method of power spectral density estimation (P. D. Welch, "The use of fast Fourier
// transform for the estimation of power spectra: a method based on time averaging over short,
// modified periodograms", IEEE Trans. Audio Electroacoustics 15(2), 1967): Hann-windowed segments
// overlapping by half, periodograms averaged. Only ratios of two estimates are used in the tests,
// so the window's scale cancels.
import { RealFft } from '@shared/audio/fft';

export function welchPsd(x: ArrayLike<number>, segment = 4096): Float64Array {
  const fft = new RealFft(segment);
  const bins = segment / 2 + 1;
  const psd = new Float64Array(bins);
  const buf = new Float64Array(segment);
  const re = new Float64Array(bins);
  const im = new Float64Array(bins);
  let count = 0;
  for (let start = 0; start + segment <= x.length; start += segment / 2) {
    for (let i = 0; i < segment; i++) buf[i] = x[start + i]! * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / segment));
    fft.forward(buf, re, im);
    for (let k = 0; k < bins; k++) psd[k]! += re[k]! * re[k]! + im[k]! * im[k]!;
    count++;
  }
  for (let k = 0; k < bins; k++) psd[k]! /= count;
  return psd;
}
