// The lot as a CSV file: the conditions as `# key: value` lines, then every item with its deviation,
// bin, matched set and verdict (formula cells escaped). Built in a pool worker (server/pool/tasks.ts
// `lotExportCsv`): a 100,000-item lot's statistics, matched sets and text take about a second.
import type Database from 'better-sqlite3';
import Papa from 'papaparse';
import { lotConditions, withConditions } from '@shared/csv/conditions';
import { lotStats, lotValues, type LotRow } from './repository';

export interface LotExportMatching {
  matchPct?: number;
  setSize?: number;
}

/** The export's text for the lot's readings as they are now, with the matching asked for. */
export function lotExportCsv(sqlite: Database.Database, lot: LotRow, matching: LotExportMatching, madeAt: Date): string {
  const data = lotValues(sqlite, lot.id);
  const stats = lotStats(lot, data, { ...matching, withBinIndices: true });
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
    matchPct: matching.matchPct ?? 1,
    setSize: matching.setSize ?? 2,
    madeAt,
  });
  const body = Papa.unparse(rows, { escapeFormulae: true, newline: '\n' });
  return withConditions(conditions, `${body}\n`);
}
