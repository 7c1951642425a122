// The harness engine refuses values it cannot solve (a matrix that becomes singular in floating point,
// e.g. a 1e308 F capacitor, or a frequency of 5e-324 Hz). Those are the request's values, so the answer is a
// 422; the physical ranges every schema checks are the shared range table's business, this is the backstop.
import { unprocessable } from '@server/http/errors';
import { HarnessUnsolvableError } from '@shared/circuit/solver';

export class UnsolvableHarness extends Error {}

const ENGINE_REFUSAL = /singular|not finite/;

/** Runs one engine computation; an engine refusal or a non-finite result becomes UnsolvableHarness. */
export function solveChecked<T>(compute: () => T, results: (r: T) => ArrayLike<number>[]): T {
  let r: T;
  try {
    r = compute();
  } catch (err) {
    if (err instanceof HarnessUnsolvableError || (err instanceof Error && ENGINE_REFUSAL.test(err.message)))
      throw new UnsolvableHarness(err.message);
    throw err;
  }
  for (const a of results(r)) {
    for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i]!)) throw new UnsolvableHarness('a result is not a finite number');
  }
  return r;
}

/** As solveChecked, answering 422 when the values cannot be solved. */
export function solveOrRefuse<T>(compute: () => T, results: (r: T) => ArrayLike<number>[]): T {
  try {
    return solveChecked(compute, results);
  } catch (err) {
    if (err instanceof UnsolvableHarness) {
      throw unprocessable('The wiring cannot be computed with these values (they are far outside what a harness holds).', {
        values: 'Values outside what the engine can solve.',
      });
    }
    throw err;
  }
}
