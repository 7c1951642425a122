// Listen benchmark: the filter for a new knob setting (impulse response at 48 kHz, what a knob
// move costs before the crossfade) and rendering 10 s of mono 48 kHz audio through a design, each
// beside a reference measured in the same run: the 151-point harness curve with its figures (what
// a knob move costs the plot), and the bare FFTs the render cannot avoid (fft.js forward and
// inverse over the same number of blocks).
import { convolve, prepareFilter } from '@shared/audio/convolve';
import { harnessResponse, impulseResponse, realFft } from '@shared/audio/impulse';
import { synthesizePhrase } from '@shared/audio/phrase';
import { renderChannels } from '@shared/audio/render';
import { simulate } from '@shared/circuit/metrics';
import { getPreset } from '@shared/circuit/presets';
import { compileHarness } from '@shared/circuit/solver';
import { seededNormals } from '@shared/random/seeded';
import { timeMedian, type BenchFigure } from './report';

const fmt = (ms: number) => (ms < 1 ? `${(ms * 1000).toFixed(0)} µs` : `${ms.toFixed(2)} ms`);

export async function bench(): Promise<BenchFigure[]> {
  const fs = 48000;
  const preset = getPreset('bleed-cap')!;
  const compiled = compileHarness(preset.build(preset.defaults));
  let turn = 0;
  const nextKnobs = () => ({ volume: 2 + (turn++ % 80) / 10, tone: 7 });

  const irMs = timeMedian(() => impulseResponse(harnessResponse(compiled, nextKnobs()), fs), 40, 10);
  const curveMs = timeMedian(() => simulate(compiled, nextKnobs()), 40, 10);

  const g = seededNormals(1);
  const audio = Float32Array.from({ length: 10 * fs }, () => 0.1 * g());
  const design = harnessResponse(compiled, { volume: 4, tone: 10 });
  const renderMs = timeMedian(() => renderChannels([audio], fs, design), 7, 2);
  const filter = prepareFilter(impulseResponse(design, fs));
  const convolveMs = timeMedian(() => convolve(audio, filter), 7, 2);
  // reference: the FFTs alone, as many as the overlap-add uses (one real forward per block, one complex inverse per two blocks)
  const blocks = Math.ceil(audio.length / filter.block);
  const fft = realFft(filter.fftSize);
  const a = new Float64Array(2 * filter.fftSize);
  const b = new Float64Array(2 * filter.fftSize);
  const fftMs = timeMedian(
    () => {
      for (let k = 0; k < blocks; k++) fft.forwardInto(audio, k * filter.block, (k + 1) * filter.block, k % 2 ? b : a);
      for (let k = 0; k < blocks; k += 2) fft.inversePair(a, b);
    },
    7,
    2,
  );
  const phraseMs = timeMedian(() => synthesizePhrase({ sampleRate: fs }), 5, 1);

  return [
    {
      name: 'Listen: the filter for a new knob setting (impulse response, 4096 samples at 48 kHz, treble-bleed preset)',
      measured: fmt(irMs),
      reference: `one 151-point curve with its figures ${fmt(curveMs)} (ratio ${(irMs / curveMs).toFixed(1)}×)`,
      goal: '≤ 5 ms',
      met: irMs <= 5,
    },
    {
      name: 'Listen: render 10 s of mono 48 kHz audio through a design (filter + overlap-add)',
      measured: `${fmt(renderMs)} (convolution alone ${fmt(convolveMs)})`,
      reference: `the bare FFTs of the same blocks ${fmt(fftMs)} (ratio ${(renderMs / fftMs).toFixed(1)}×)`,
      goal: '≤ 150 ms',
      met: renderMs <= 150,
    },
    {
      name: 'Listen: synthesise the built-in phrase (6 s at 48 kHz, one pickup)',
      measured: fmt(phraseMs),
      reference: `render of 10 s ${fmt(renderMs)}`,
      goal: 'no goal set (shown for the record)',
      met: true,
    },
  ];
}
