// The engine's one least-squares path against the NIST Statistical Reference Datasets for
// non-linear regression (NIST/ITL StRD, https://www.itl.nist.gov/div898/strd/nls/nls_main.shtml;
// public domain). The .dat files in tests/fixtures/nist-nonlinear/ are verbatim copies (source line
// at the top of each) and carry the certified values in their own header, which is parsed here:
// nothing below is typed in by hand except the model formulas, which are copied from each file's
// "Model:" block.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { fitLeastSquares } from '@shared/analysis/least-squares';

interface NistSet {
  starts: [number[], number[]];
  certified: number[];
  certifiedSd: number[];
  rss: number;
  x: number[];
  y: number[];
}

function readSet(name: string): NistSet {
  const path = fileURLToPath(new URL(`../../fixtures/nist-nonlinear/${name}.dat`, import.meta.url));
  const lines = readFileSync(path, 'utf8').split('\n');
  if (!lines[0]?.startsWith('# Source: NIST/ITL StRD')) throw new Error(`${name}: source line missing`);
  const set: NistSet = { starts: [[], []], certified: [], certifiedSd: [], rss: Number.NaN, x: [], y: [] };
  let inData = false;
  for (const line of lines) {
    const b = /^\s*b\d+\s*=\s*(\S+)\s+(\S+)\s+(\S+)\s+(\S+)\s*$/.exec(line);
    if (b) {
      set.starts[0].push(Number(b[1]));
      set.starts[1].push(Number(b[2]));
      set.certified.push(Number(b[3]));
      set.certifiedSd.push(Number(b[4]));
    }
    const rss = /^Residual Sum of Squares:\s+(\S+)/.exec(line);
    if (rss) set.rss = Number(rss[1]);
    if (/^Data:\s+y\s+x\s*$/.test(line)) {
      inData = true;
      continue;
    }
    if (inData && line.trim() !== '') {
      const [y, x] = line.trim().split(/\s+/).map(Number);
      set.y.push(y as number);
      set.x.push(x as number);
    }
  }
  return set;
}

// Model formulas, copied from the "Model:" block of each file.
const models: Record<string, (b: number[]) => (x: number) => number> = {
  // y = b1*(1-exp[-b2*x])
  Misra1a:
    ([b1 = 0, b2 = 0]) =>
    (x) =>
      b1 * (1 - Math.exp(-b2 * x)),
  // y = exp[-b1*x]/(b2+b3*x)
  Chwirut2:
    ([b1 = 0, b2 = 0, b3 = 0]) =>
    (x) =>
      Math.exp(-b1 * x) / (b2 + b3 * x),
  // y = b1*b2*x*((1+b2*x)**(-1))
  Misra1d:
    ([b1 = 0, b2 = 0]) =>
    (x) =>
      (b1 * b2 * x) / (1 + b2 * x),
  // y = b1*(1-exp[-b2*x])
  BoxBOD:
    ([b1 = 0, b2 = 0]) =>
    (x) =>
      b1 * (1 - Math.exp(-b2 * x)),
  // y = b1*(x**2+x*b2) / (x**2+x*b3+b4)
  MGH09:
    ([b1 = 0, b2 = 0, b3 = 0, b4 = 0]) =>
    (x) =>
      (b1 * (x * x + x * b2)) / (x * x + x * b3 + b4),
  // y = (b1 + b2*x + b3*x**2 + b4*x**3) / (1 + b5*x + b6*x**2 + b7*x**3)
  Thurber:
    ([b1 = 0, b2 = 0, b3 = 0, b4 = 0, b5 = 0, b6 = 0, b7 = 0]) =>
    (x) =>
      (b1 + b2 * x + b3 * x ** 2 + b4 * x ** 3) / (1 + b5 * x + b6 * x ** 2 + b7 * x ** 3),
  // y = (b1/b2) * exp[-0.5*((x-b3)/b2)**2]
  Eckerle4:
    ([b1 = 0, b2 = 0, b3 = 0]) =>
    (x) =>
      (b1 / b2) * Math.exp(-0.5 * ((x - b3) / b2) ** 2),
  // y = b1 / (1+exp[b2-b3*x])
  Rat42:
    ([b1 = 0, b2 = 0, b3 = 0]) =>
    (x) =>
      b1 / (1 + Math.exp(b2 - b3 * x)),
};

/** Relative error, as in NIST's log relative error LRE = −log10(|fit − certified|/|certified|). */
const relErr = (value: number, certified: number) => Math.abs(value - certified) / Math.abs(certified);

function fitSet(name: string, start: 1 | 2) {
  const set = readSet(name);
  const f = models[name];
  if (!f) throw new Error(`no model for ${name}`);
  const result = fitLeastSquares({
    observed: set.y,
    initial: set.starts[start - 1] as number[],
    model: (b) => {
      const g = f(b);
      return (i) => g(set.x[i] as number);
    },
  });
  return { set, result };
}

// ≥ 6 significant digits: relative error at most 1e-6 (LRE ≥ 6) for every certified parameter,
// every certified standard deviation and the residual sum of squares.
const SIX_DIGITS = 1e-6;

// Required (docs/computation.md §1 of the checks): lower and average difficulty, from both starts.
// Stretch sets (higher difficulty) listed here are the ones this path reaches; Eckerle4 from
// start 1 does not (see the report) and is not listed.
const cases: [string, 1 | 2][] = [
  ['Misra1a', 1],
  ['Misra1a', 2],
  ['Chwirut2', 1],
  ['Chwirut2', 2],
  ['Misra1d', 1],
  ['Misra1d', 2],
  ['BoxBOD', 1],
  ['BoxBOD', 2],
  ['MGH09', 1],
  ['MGH09', 2],
  ['Thurber', 1],
  ['Thurber', 2],
  ['Eckerle4', 2],
  ['Rat42', 1],
  ['Rat42', 2],
];

describe('fitLeastSquares against NIST StRD non-linear regression (certified values)', () => {
  it.each(cases)('%s from NIST start %i reaches the certified values to 6 digits', (name, start) => {
    const { set, result } = fitSet(name, start);
    expect(set.certified.length).toBeGreaterThan(1);
    expect(set.x.length).toBeGreaterThan(set.certified.length);
    expect(result.converged).toBe(true);
    result.params.forEach((p, k) => expect(relErr(p, set.certified[k] as number)).toBeLessThan(SIX_DIGITS));
    result.stderr.forEach((s, k) => expect(relErr(s, set.certifiedSd[k] as number)).toBeLessThan(SIX_DIGITS));
    expect(relErr(result.ssr, set.rss)).toBeLessThan(SIX_DIGITS);
    expect(result.dof).toBe(set.x.length - set.certified.length);
  });

  it('reports not converged when the budget stops it far from the minimum', () => {
    // Misra1a from start 1 with a budget of a single iteration cannot be at the certified minimum.
    const set = readSet('Misra1a');
    const g = models.Misra1a!;
    const result = fitLeastSquares({
      observed: set.y,
      initial: set.starts[0],
      maxIterations: 1,
      model: (b) => {
        const f = g(b);
        return (i) => f(set.x[i] as number);
      },
    });
    expect(result.converged).toBe(false);
    expect(result.ssr).toBeGreaterThan(set.rss * 1.001);
  });

  it('gives the same answer with an analytic Jacobian (Misra1a, start 2)', () => {
    const set = readSet('Misra1a');
    const result = fitLeastSquares({
      observed: set.y,
      initial: set.starts[1],
      model:
        ([b1 = 0, b2 = 0]) =>
        (i) =>
          b1 * (1 - Math.exp(-b2 * (set.x[i] as number))),
      // ∂/∂b1 = 1 − e^(−b2 x), ∂/∂b2 = b1·x·e^(−b2 x)
      jacobian:
        ([b1 = 0, b2 = 0]) =>
        (i) => {
          const x = set.x[i] as number;
          const e = Math.exp(-b2 * x);
          return [1 - e, b1 * x * e];
        },
    });
    expect(result.converged).toBe(true);
    result.params.forEach((p, k) => expect(relErr(p, set.certified[k] as number)).toBeLessThan(SIX_DIGITS));
    result.stderr.forEach((s, k) => expect(relErr(s, set.certifiedSd[k] as number)).toBeLessThan(SIX_DIGITS));
  });
});
