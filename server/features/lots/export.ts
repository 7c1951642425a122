// GET /api/lots/:id/export.csv: the lot's CSV file (export-csv.ts), built in a pool worker and sent a
// slice at a time.
import type { AppContext } from '@server/context';
import type { ApiRouter } from '@server/http/router';
import { sendDownload } from '@server/http/encoded';
import { IdParamsSchema } from '@shared/schemas/common';
import { LotStatsQuerySchema } from '@shared/schemas/lots';
import { lotFinder } from './common';

/** Building the file is bounded by the upload's 100,000 rows, not by the request: two of the pool's budgets. */
const EXPORT_BUDGETS = 2;

export function lotExportRoutes(api: ApiRouter, ctx: AppContext) {
  const { sqlite, pool } = ctx;
  const mustFind = lotFinder(ctx);

  api.get('/:id/export.csv', {
    schemas: { params: IdParamsSchema, query: LotStatsQuerySchema },
    handle: async ({ params, query, res }) => {
      const lot = mustFind(params.id);
      const bytes = await pool.run(
        'lotExportCsv',
        { dbFile: sqlite.name, lot, matching: query, madeAt: Date.now() },
        { budgetMs: pool.options.budgetMs * EXPORT_BUDGETS },
      );
      await sendDownload(res, bytes, 'text/csv', `${lot.code}.csv`);
      return undefined;
    },
  });
}
