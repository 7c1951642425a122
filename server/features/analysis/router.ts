// Stateless analysis: the measurement engine of shared/analysis behind HTTP, for any signed-in role.
import type { AppContext } from '@server/context';
import { unprocessable } from '@server/http/errors';
import { sendJsonBytes } from '@server/http/encoded';
import { ApiRouter, bodyBytes } from '@server/http/router';
import { decodeMarking } from '@shared/markings/decode';
import { MarkingError } from '@shared/markings/tolerance-letters';
import { CoilRequestSchema, MarkingRequestSchema, ValueRequestSchema } from '@shared/schemas/analysis';
import { parseValue, ValueParseError } from '@shared/units/parse';
import type { Quantity } from '@shared/units/quantities';

/** The engine's own refusals (RangeError, parse and marking errors) become a 422 naming the field. */
async function asUnprocessable<T>(field: string, run: () => T | Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (err) {
    if (err instanceof RangeError || err instanceof ValueParseError || err instanceof MarkingError) {
      throw unprocessable(err.message, { [field]: err.message });
    }
    throw err;
  }
}

export function analysisRoutes({ pool }: AppContext) {
  const api = new ApiRouter('/api/analysis');

  api.post('/value', {
    schemas: { body: ValueRequestSchema },
    handle: ({ body }) => asUnprocessable('text', () => parseValue(body.text, body.quantity as Quantity | undefined)),
  });

  api.post('/marking', {
    schemas: { body: MarkingRequestSchema },
    handle: ({ body }) => asUnprocessable('code', () => decodeMarking(body.code)),
  });

  // In the job pool (server/pool), as are the coil fit and the lot statistics: up to 20,000 points.
  // Its body is parsed and validated there too (jobs.ts).
  api.post('/taper', {
    jsonInWorker: true,
    bodyLimit: '2mb',
    handle: ({ req }) => asUnprocessable('points', () => pool.run('taperFit', { body: bodyBytes(req) })),
  });

  // Up to 5,000 points.
  api.post('/coil', {
    schemas: { body: CoilRequestSchema },
    bodyLimit: '1mb',
    handle: async ({ body }) => {
      try {
        return await pool.run('coilFit', body);
      } catch (err) {
        if (err instanceof RangeError) throw unprocessable(err.message, { points: err.message });
        throw err;
      }
    },
  });

  // Up to 200,000 values (and their second readings): the answer, with a deviation per value, is made
  // as JSON text in the worker and sent in slices.
  api.post('/lot', {
    jsonInWorker: true,
    bodyLimit: '5mb',
    handle: async ({ req, res }) => {
      const bytes = await asUnprocessable('values', () => pool.run('lotStatisticsJson', { body: bodyBytes(req) }));
      await sendJsonBytes(res, bytes, null);
      return undefined;
    },
  });

  return api;
}
