// Stateless analysis: the measurement engine of shared/analysis behind HTTP, for any signed-in role.
import type { AppContext } from '@server/context';
import { unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { lotStatistics } from '@shared/analysis/lot-stats';
import { fitTaper } from '@shared/analysis/taper';
import { decodeMarking } from '@shared/markings/decode';
import { MarkingError } from '@shared/markings/tolerance-letters';
import {
  CoilRequestSchema,
  LotRequestSchema,
  MarkingRequestSchema,
  TaperRequestSchema,
  ValueRequestSchema,
} from '@shared/schemas/analysis';
import { parseValue, ValueParseError } from '@shared/units/parse';
import type { Quantity } from '@shared/units/quantities';

/** The engine's own refusals (RangeError, parse and marking errors) become a 422 naming the field. */
function asUnprocessable<T>(field: string, run: () => T): T {
  try {
    return run();
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

  api.post('/taper', {
    schemas: { body: TaperRequestSchema },
    handle: ({ body }) => asUnprocessable('points', () => fitTaper(body)),
  });

  // In the job pool (server/pool): up to 20,000 points.
  api.post('/coil', {
    schemas: { body: CoilRequestSchema },
    handle: async ({ body }) => {
      try {
        return await pool.run('coilFit', body);
      } catch (err) {
        if (err instanceof RangeError) throw unprocessable(err.message, { points: err.message });
        throw err;
      }
    },
  });

  api.post('/lot', {
    schemas: { body: LotRequestSchema },
    handle: ({ body }) => {
      if (body.second && body.second.values.length !== body.values.length) {
        throw unprocessable('second.values must have one value per part.', {
          'second.values': `Expected ${body.values.length} values, got ${body.second.values.length}.`,
        });
      }
      const stats = asUnprocessable('values', () => lotStatistics(body));
      return { ...stats, deviationsPct: Array.from(stats.deviationsPct) };
    },
  });

  return api;
}
