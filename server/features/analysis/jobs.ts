// The analysis routes that take whole sweeps or lots of values, as pool jobs (server/pool/tasks.ts): the
// body's bytes are parsed and validated here (json-body.ts), then computed with. On the request thread
// the parse and validation of 200,000 values alone took 30–70 ms.
import { jsonBytes } from '@server/http/encoded';
import { parseJsonBody } from '@server/http/json-body';
import { unprocessable } from '@server/http/errors';
import { lotStatistics } from '@shared/analysis/lot-stats';
import { fitTaper } from '@shared/analysis/taper';
import { LotRequestSchema, TaperRequestSchema } from '@shared/schemas/analysis';

/** POST /api/analysis/taper: a taper fit of up to 20,000 points. */
export function taperFitOfBody(body: Uint8Array) {
  return fitTaper(parseJsonBody(body, TaperRequestSchema));
}

/** POST /api/analysis/lot: a lot's statistics for up to 200,000 values, as the JSON text of the answer. */
export function lotStatisticsOfBody(body: Uint8Array): Uint8Array {
  const input = parseJsonBody(body, LotRequestSchema);
  if (input.second && input.second.values.length !== input.values.length) {
    throw unprocessable('second.values must have one value per part.', {
      'second.values': `Expected ${input.values.length} values, got ${input.second.values.length}.`,
    });
  }
  const stats = lotStatistics(input);
  return jsonBytes({ ...stats, deviationsPct: Array.from(stats.deviationsPct) });
}
