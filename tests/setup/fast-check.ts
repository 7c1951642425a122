import fc from 'fast-check';

// Property tests explore new random cases on every developer run; in CI they run from one fixed
// seed so that a landing never depends on luck. A failure prints its seed to replay it.
if (process.env.CI) fc.configureGlobal({ seed: 20261202 });
