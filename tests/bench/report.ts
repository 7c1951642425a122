// Shared shape of a benchmark figure. Each area file (tests/bench/<area>.ts) exports
// `bench(): Promise<BenchFigure[]>`; tests/bench/run.ts prints them all. Figures are ratios or times
// against a reference measured in the same process, never assertions in the test suite.
export interface BenchFigure {
  /** What was measured, e.g. "taper fit, 300 points". */
  name: string;
  /** The measured figure in words with units, e.g. "0.21 ms". */
  measured: string;
  /** The reference measured in the same run, e.g. "ngspice warm 180 ms (ratio 85×)". */
  reference: string;
  /** The goal from docs/computation.md §7, e.g. "≤ 1 ms". */
  goal: string;
  met: boolean;
}

/** Median wall time in milliseconds of `fn` over `runs` runs after `warmup` runs. */
export function timeMedian(fn: () => unknown, runs = 20, warmup = 5): number {
  for (let i = 0; i < warmup; i++) fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)]!;
}

export async function timeMedianAsync(fn: () => Promise<unknown>, runs = 5, warmup = 1): Promise<number> {
  for (let i = 0; i < warmup; i++) await fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    await fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)]!;
}
