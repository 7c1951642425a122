// Stored with every fit so that a stored result can be traced to the code that made it.
// Bump when the results of the taper or coil fit (or the least-squares path under them) change.
export const ANALYSIS_ENGINE_VERSION = 'analysis-1.1.0';
