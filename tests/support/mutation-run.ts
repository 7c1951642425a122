// Test sizes for the mutation runs (npm run mutation, tests/mutation/vitest.config.ts sets
// LUGBOOK_MUTATION_RUN=1). Stryker runs every test that covers a mutant once per mutant, with the
// code instrumented; a test over 20,000 parts that takes 2 s in `npm test` then costs 2 s or more
// for each of hundreds of mutants. Such tests use a smaller size there: what they check is the
// same, on fewer cases. `npm test` and CI always run the full sizes.
export const MUTATION_RUN = process.env.LUGBOOK_MUTATION_RUN === '1';

/** `full` in `npm test`, `inMutationRun` in the mutation runs. */
export function sized(full: number, inMutationRun: number): number {
  return MUTATION_RUN ? inMutationRun : full;
}
