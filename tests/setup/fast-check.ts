import fc from 'fast-check';

// Property tests explore new random cases on every developer run; in CI they run from one fixed
// seed so that a landing never depends on luck, and so do the mutation runs (a mutant is killed or
// not whatever the day's seed). A failure prints its seed to replay it.
if (process.env.CI || process.env.LUGBOOK_MUTATION_RUN) fc.configureGlobal({ seed: 20261202 });
