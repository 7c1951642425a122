// The lot as a CSV file: the conditions as `# key: value` lines, then every item with its deviation,
// bin, matched set and verdict (formula cells escaped).
import Papa from 'papaparse';
import type { AppContext } from '@server/context';
import type { ApiRouter } from '@server/http/router';
import { lotConditions, withConditions } from '@shared/csv/conditions';
import { IdParamsSchema } from '@shared/schemas/common';
import { LotStatsQuerySchema } from '@shared/schemas/lots';
import { lotFinder } from './common';
import { lotStats, lotValues } from './repository';

export function lotExportRoutes(api: ApiRouter, ctx: AppContext) {
  const { sqlite } = ctx;
  const mustFind = lotFinder(ctx);

  api.get('/:id/export.csv', {
    schemas: { params: IdParamsSchema, query: LotStatsQuerySchema },
    handle: ({ params, query, res }) => {
      const lot = mustFind(params.id);
      const data = lotValues(sqlite, lot.id);
      const stats = lotStats(lot, data, { ...query, withBinIndices: true });
      const n = data.values.length;
      const binOf = new Array<string>(n).fill('');
      stats?.bins.forEach((b) => b.indices?.forEach((i) => (binOf[i] = b.label)));
      const setOf = new Array<string>(n).fill('');
      stats?.matchedSets.forEach((s, si) => s.indices.forEach((i) => (setOf[i] = `S${si + 1}`)));
      const rows = Array.from({ length: n }, (_, i) => {
        const v = data.values[i]!;
        const verdict = stats ? (v < stats.lower || v > stats.upper ? 'fail' : 'pass') : '';
        return {
          item: data.items[i],
          value: v,
          deviation_pct: stats ? Number(stats.deviationsPct[i]!.toFixed(4)) : '',
          bin: binOf[i],
          set: setOf[i],
          verdict,
        };
      });
      const conditions = lotConditions(lot, {
        readings: n,
        matchPct: query.matchPct ?? 1,
        setSize: query.setSize ?? 2,
        madeAt: new Date(),
      });
      const body = Papa.unparse(rows, { escapeFormulae: true, newline: '\n' });
      res
        .type('text/csv')
        .attachment(`${lot.code}.csv`)
        .send(withConditions(conditions, `${body}\n`));
      return undefined;
    },
  });
}
