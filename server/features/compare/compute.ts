// Compare's work that grows with the selection, done in a pool worker on the worker's own connection
// (server/pool/tasks.ts `compareTapersJson`, `comparisonCsv`): the taper comparison reads every
// selected pot's sweep (up to 20,000 points each), puts the curves on the grid and makes the answer's
// JSON text (4 MB when five of the pots have such sweeps; compressed here too), which on the request
// thread kept /api/health waiting 180–300 ms; the saved comparison's CSV reads the fits only.
import type Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import Papa from 'papaparse';
import type { z } from 'zod';
import * as schema from '@server/db/schema';
import { compareTapers, groupOf, type CompareGroup, type ComparePot, type GroupBy } from '@shared/analysis/compare';
import { withConditions } from '@shared/csv/conditions';
import type { CompareSelection, CompareTapersRequestSchema } from '@shared/schemas/compare';
import { resolveSelection, resolveSelectionFits } from './repository';

/** POST /api/compare/tapers's body, as validated. */
export type TaperComparisonRequest = z.output<typeof CompareTapersRequestSchema>;

/** POST /api/compare/tapers's answer (the client's CompareTapersResponse). */
export interface TaperComparison {
  groupBy: GroupBy;
  grid: number[];
  pots: (ComparePot & { group: string; gridCurve: (number | null)[] })[];
  groups: CompareGroup[];
  missing: number[];
}

/** The selected pots' curves on the grid, each group's statistics and envelopes. */
export function taperComparison(sqlite: Database.Database, request: TaperComparisonRequest): TaperComparison {
  const { pots, missing } = resolveSelection({ db: drizzle(sqlite, { schema }), sqlite }, request.selection);
  const result = compareTapers(pots, request.groupBy, request.gridPoints);
  return {
    groupBy: request.groupBy,
    grid: result.grid,
    pots: pots.map((p, i) => ({ ...p, group: groupOf(p, request.groupBy).key, gridCurve: result.gridCurves[i]! })),
    groups: result.groups,
    missing,
  };
}

const EXPORT_FIELDS = [
  'part',
  'group',
  'lot',
  'supplier',
  'nominal_ohm',
  'law',
  'm',
  'r2',
  'max_deviation_pct',
  'total_ohm',
  'total_deviation_pct',
  'end_resistance_start_ohm',
  'end_resistance_end_ohm',
];

export interface ComparisonCsvInput {
  comparison: { id: number; name: string; selection: CompareSelection };
  groupBy: GroupBy;
  /** When the export was asked for (ms since 1970): the file's `exported` line. */
  exportedAt: number;
}

/** A saved comparison's CSV: its conditions, then one row of fitted parameters per pot (formula-escaped). */
export function comparisonCsv(sqlite: Database.Database, { comparison, groupBy, exportedAt }: ComparisonCsvInput): string {
  const { pots } = resolveSelectionFits(drizzle(sqlite, { schema }), comparison.selection);
  const rows = pots.map((p) => ({
    part: p.label,
    group: groupOf(p, groupBy).label,
    lot: p.lotCode ?? '',
    supplier: p.supplier ?? '',
    nominal_ohm: p.nominal ?? '',
    law: p.fit.law,
    m: p.fit.m,
    r2: p.fit.r2,
    max_deviation_pct: p.fit.maxPct,
    total_ohm: p.fit.total,
    total_deviation_pct: p.fit.totalDeviationPct ?? '',
    end_resistance_start_ohm: p.fit.endResistance.start,
    end_resistance_end_ohm: p.fit.endResistance.end ?? '',
  }));
  return withConditions(
    [
      { key: 'comparison', value: `${comparison.name} (#${comparison.id})` },
      { key: 'selection', value: JSON.stringify(comparison.selection ?? {}) },
      { key: 'grouped by', value: groupBy },
      { key: 'pots', value: pots.length },
      { key: 'exported', value: new Date(exportedAt).toISOString().replace(/\.\d{3}Z$/, 'Z') },
    ],
    `${Papa.unparse({ fields: EXPORT_FIELDS, data: rows }, { escapeFormulae: true, newline: '\n' })}\n`,
  );
}
