// The engine version stored with every fit names the code that made it: "analysis-" and a semantic
// version (semver.org, 2.0.0: MAJOR.MINOR.PATCH), so stored results of an older engine can be told apart.
import { expect, it } from 'vitest';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';

it('is "analysis-" and a semantic version', () => {
  expect(ANALYSIS_ENGINE_VERSION).toMatch(/^analysis-(0|[1-9]\d*)\.(0|[1-9]\d*)\.(0|[1-9]\d*)$/);
});
