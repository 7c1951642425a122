// Speed of the taper and coil fits (docs/computation.md §7), each beside a reference measured in the same
// run: a plain loop that evaluates the model once over the same points.
import { fitCoil, coilImpedance, type CoilPoint } from '@shared/analysis/coil';
import { fitTaper, type TaperPoint } from '@shared/analysis/taper';
import { taperLawValue } from '@shared/taper/law';
import { timeMedian, type BenchFigure } from './report';
import { seededNormals } from '@shared/random/seeded';

function taperFigure(): BenchFigure {
  const g = seededNormals(7);
  const total = 500_000;
  const points: TaperPoint[] = Array.from({ length: 300 }, (_, i) => {
    const x = i / 299;
    return { rotation: x * 300, resistance: total * (taperLawValue('audio', 0.15, x) * (1 + 0.01 * g()) + 0.002 * g()) };
  });
  let law = '';
  const ms = timeMedian(
    () => {
      law = fitTaper({ points, rotationUnit: 'deg', total }).law;
    },
    200,
    50,
  );
  // Reference: one evaluation of the audio law over the 300 points.
  let sink = 0;
  const evalMs =
    timeMedian(
      () => {
        for (let r = 0; r < 1000; r++) for (const p of points) sink += taperLawValue('audio', 0.15 + r * 1e-6, p.rotation / 300);
      },
      20,
      5,
    ) / 1000;
  if (sink === 0 || law === '') throw new Error('bench: nothing computed');
  return {
    name: 'taper fit, 300 points (four laws)',
    measured: `${ms.toFixed(3)} ms`,
    reference: `one audio-law evaluation over the points ${(evalMs * 1000).toFixed(2)} µs (fit = ${(ms / evalMs).toFixed(0)} evaluations)`,
    goal: '≤ 1 ms',
    met: ms <= 1,
  };
}

function coilFigure(): BenchFigure {
  const g = seededNormals(11);
  const truth = { R: 8000, L: 4.4, C: 120e-12 }; // humbucker-like, common practice (no published source)
  const frequencies = Array.from({ length: 400 }, (_, i) => 10 * 10 ** ((4 * i) / 399));
  const points: CoilPoint[] = frequencies.map((frequency) => {
    const z = coilImpedance(truth, frequency);
    return {
      frequency,
      magnitude: Math.hypot(z.re, z.im) * (1 + 0.01 * g()),
      phaseDeg: ((Math.atan2(z.im, z.re) + 0.01 * g()) * 180) / Math.PI,
    };
  });
  let converged = false;
  let iterations = 0;
  const ms = timeMedian(
    () => {
      const fit = fitCoil({ points });
      converged = fit.converged;
      iterations = fit.iterations;
    },
    100,
    60,
  );
  // Reference: one evaluation of Z over the 400 points (the least a fit iteration must do).
  let sink = 0;
  const evalMs =
    timeMedian(
      () => {
        for (let r = 0; r < 100; r++) {
          for (const f of frequencies) {
            const z = coilImpedance(truth, f * (1 + r * 1e-9));
            sink += Math.log(Math.hypot(z.re, z.im)) + Math.atan2(z.im, z.re);
          }
        }
      },
      20,
      5,
    ) / 100;
  if (sink === 0) throw new Error('bench: nothing computed');
  return {
    name: 'coil fit, 400 points (R, L, C; 1 % noise)',
    measured: `${ms.toFixed(2)} ms, ${iterations} iterations, ${converged ? 'converged' : 'NOT converged'}`,
    reference: `one model evaluation over the points ${(evalMs * 1000).toFixed(1)} µs (fit = ${(ms / evalMs).toFixed(0)} evaluations, ${(ms / evalMs / Math.max(1, iterations)).toFixed(1)} per iteration)`,
    goal: '≤ 3 ms, converged',
    met: ms <= 3 && converged,
  };
}

export async function bench(): Promise<BenchFigure[]> {
  return [taperFigure(), coilFigure()];
}
