// A sweep file (docs/domain.md, "Sweep"): a pot's rotation sweep or a pickup's impedance sweep, read into
// the points the taper and coil fits take (shared/analysis/taper.ts, shared/analysis/coil.ts).
//
// Every problem is reported with its line and column, all of them (up to MAX_ISSUES, in line
// order), so the user can fix the file in one pass. Decisions:
// - Number cells: plain numbers, optionally followed by the column's unit as written in the header
//   (see ./cell-number.ts); `12.5k` and `12k7` are refused.
// - Rows may come in any order (a fixture sweeping back) and are sorted; a repeated rotation or
//   frequency is an error, since the fits would weigh it twice and a repeat usually means a pasted block.
// - Rotation: 0–100 % or 0–360° — single-turn pots; 300° is the usual travel — common practice (no published source).
//   A rotation column with no unit is read as degrees when any value exceeds 100, else as percent,
//   and the result's notes say so.
// - Resistance and wiper-to-lug-3 values must not be negative (zero is a real reading at the track's
//   end); an empty wiper-to-lug-3 cell means "not measured at this point".
// - Frequency and |Z| must be greater than zero (the coil fit works on log|Z|), the phase within
//   ±180° (±π rad). Real and imaginary parts may have either sign.
import type { CoilPoint } from '@shared/analysis/coil';
import type { TaperPoint } from '@shared/analysis/taper';
import { readNumberCell } from './cell-number';
import {
  columnsUsed,
  resolveColumns,
  roleWord,
  ROLES_OF,
  scaleExponent,
  type ColumnInfo,
  type ColumnMapping,
  type ColumnRole,
  type ExplicitMapping,
  type NeedsMapping,
} from './columns';
import { MAX_SWEEP_POINTS, type SweepKind } from '@shared/schemas/sweeps';
import { capIssues, csvIssue, type CsvIssue } from './issues';
import { scanTable, type TableRow } from './read-table';

export const MIN_POINTS: Record<SweepKind, number> = { taper: 3, impedance: 5 };
const MAX_ROTATION: Record<'deg' | 'percent', number> = { deg: 360, percent: 100 };

export interface SweepOptions {
  mapping?: ExplicitMapping;
  /** Most data rows accepted; default MAX_SWEEP_POINTS of the kind (20,000 taper, 5,000 impedance). */
  maxRows?: number;
}

interface SweepOkBase {
  ok: true;
  /** role → header text of the column used. */
  columns: Record<string, string>;
  /** Header texts of the file's columns that the reader did not use: listed back to the user, never dropped silently. */
  ignored: string[];
  rowCount: number;
  /** Decisions the reader took that the user should see (e.g. a rotation unit inferred from the values). */
  notes: string[];
}
export interface TaperSweepOk extends SweepOkBase {
  kind: 'taper';
  /** Sorted by rotation; rotation in `rotationUnit`, resistances in Ω. */
  points: TaperPoint[];
  rotationUnit: 'deg' | 'percent';
}
export interface ImpedanceSweepOk extends SweepOkBase {
  kind: 'impedance';
  /** Sorted by frequency; Hz, Ω, degrees. */
  points: CoilPoint[];
}
export interface SweepFailure {
  ok: false;
  issues: CsvIssue[];
  /** Present when the columns were not recognised: what the mapping step needs to show. */
  needsMapping?: NeedsMapping;
}
export type TaperSweepResult = TaperSweepOk | SweepFailure;
export type ImpedanceSweepResult = ImpedanceSweepOk | SweepFailure;
export type SweepResult = TaperSweepOk | ImpedanceSweepOk | SweepFailure;

/** Reads one number column, scaling to SI and collecting issues. */
class ColumnReader {
  private readonly exp: number | null;
  private readonly suffix: string | null;
  constructor(
    readonly info: ColumnInfo,
    private readonly decimalComma: boolean,
    private readonly issues: CsvIssue[],
  ) {
    this.exp = scaleExponent(info.scale);
    this.suffix = info.unit ?? null;
  }
  /** The number in SI, or null after recording an issue (or for an empty cell when `optional`). */
  read(row: TableRow, optional = false): number | null {
    const raw = row.cells[this.info.index] ?? '';
    if (optional && raw.trim() === '') return null;
    const v = readNumberCell(raw, this.decimalComma, this.suffix, this.exp ?? 0);
    if (typeof v === 'string') {
      this.issues.push(csvIssue(row.line, this.info.header, `${v}.`));
      return null;
    }
    return this.exp === null ? v * this.info.scale : v;
  }
  problem(row: TableRow, text: string): null {
    this.issues.push(csvIssue(row.line, this.info.header, text));
    return null;
  }
}

function formatNumber(v: number): string {
  return String(Number(v.toPrecision(6)));
}

/** Sorted order of the points by x; a repeated x is reported on the later line. */
function sortAndFindRepeats<T>(
  points: { x: number; line: number; point: T }[],
  column: string,
  what: string,
  unit: string,
  issues: CsvIssue[],
): T[] {
  const sorted = [...points].sort((a, b) => a.x - b.x || a.line - b.line);
  for (let i = 1; i < sorted.length; i++) {
    const prev = sorted[i - 1]!;
    const cur = sorted[i]!;
    if (cur.x === prev.x) {
      issues.push(
        csvIssue(
          cur.line,
          column,
          `the ${what} ${formatNumber(cur.x)}${unit} appears twice (also on line ${prev.line}); each point must be measured once.`,
        ),
      );
    }
  }
  return sorted.map((p) => p.point);
}

export function parseSweepCsv(text: string, kind: 'taper', opts?: SweepOptions): TaperSweepResult;
export function parseSweepCsv(text: string, kind: 'impedance', opts?: SweepOptions): ImpedanceSweepResult;
export function parseSweepCsv(text: string, kind: SweepKind, opts?: SweepOptions): SweepResult;
export function parseSweepCsv(text: string, kind: SweepKind, opts: SweepOptions = {}): SweepResult {
  const maxRows = opts.maxRows ?? MAX_SWEEP_POINTS[kind];
  // Ragged rows are reported together with the value problems of the other rows.
  const table = scanTable(text, { minRows: MIN_POINTS[kind] });
  if (!table.ok) return table;
  if (table.rows.length > maxRows) {
    return {
      ok: false,
      issues: [
        csvIssue(
          null,
          null,
          `The file has ${table.rows.length.toLocaleString('en')} data rows; ${kind === 'impedance' ? 'an impedance' : 'a rotation'} sweep may have at most ${maxRows.toLocaleString('en')}.`,
        ),
      ],
    };
  }
  const cols = resolveColumns(table.header, kind, opts.mapping);
  if (cols.issues.length > 0 || cols.missing.length > 0) {
    const issues = [...cols.issues, ...table.raggedIssues];
    if (cols.missing.length > 0) {
      issues.push(
        csvIssue(
          table.headerLine,
          null,
          `no column found for the ${cols.missing.map(roleWord).join(' and the ')} (the header has ${table.header
            .map((h) => `"${h}"`)
            .join(', ')}); choose the columns by hand.`,
        ),
      );
    }
    return {
      ok: false,
      issues: capIssues(issues),
      needsMapping: { header: table.header, detected: cols.detected, missing: cols.missing },
    };
  }
  const result =
    kind === 'taper'
      ? readTaper(table.rows, cols.mapping, table.decimalComma, table.raggedIssues)
      : readImpedance(table.rows, cols.mapping, table.decimalComma, table.raggedIssues);
  if (!result.ok) return result;
  const used = new Set(Object.values(result.columns));
  return { ...result, ignored: table.header.filter((h) => !used.has(h)) };
}

function readTaper(rows: TableRow[], mapping: ColumnMapping, decimalComma: boolean, ragged: CsvIssue[]): TaperSweepResult {
  const issues: CsvIssue[] = [...ragged];
  const notes: string[] = [];
  const rot = new ColumnReader(mapping.rotation!, decimalComma, issues);
  const res = new ColumnReader(mapping.resistance!, decimalComma, issues);
  const w3 = mapping.resistanceW3 ? new ColumnReader(mapping.resistanceW3, decimalComma, issues) : null;
  const r13 = mapping.total ? new ColumnReader(mapping.total, decimalComma, issues) : null;

  const raw: { x: number; line: number; point: TaperPoint }[] = [];
  const rotations: { row: TableRow; value: number | null }[] = [];
  for (const row of rows) {
    const x = rot.read(row);
    rotations.push({ row, value: x });
    const r = res.read(row);
    if (r !== null && r < 0) res.problem(row, `${formatNumber(r / res.info.scale)} is negative; a resistance cannot be.`);
    const r3 = w3 ? w3.read(row, true) : null;
    if (w3 && r3 !== null && r3 < 0) w3.problem(row, `${formatNumber(r3 / w3.info.scale)} is negative; a resistance cannot be.`);
    const rt = r13 ? r13.read(row, true) : null;
    if (r13 && rt !== null && !(rt > 0))
      r13.problem(row, `${formatNumber(rt / r13.info.scale)} is not an end-to-end resistance: it must be greater than zero.`);
    if (x === null || r === null || r < 0 || (r3 !== null && r3 < 0) || (rt !== null && !(rt > 0))) continue;
    const point: TaperPoint = { rotation: x, resistance: r };
    if (r3 !== null) point.resistanceW3 = r3;
    if (rt !== null) point.total = rt;
    raw.push({ x, line: row.line, point });
  }

  let unit = mapping.rotation!.rotationUnit;
  if (!unit) {
    const max = Math.max(...rotations.map((r) => r.value ?? 0));
    unit = max > 100 ? 'deg' : 'percent';
    notes.push(
      `The rotation column "${mapping.rotation!.header}" names no unit; read as ${unit === 'deg' ? 'degrees, since a value exceeds 100' : 'percent, since no value exceeds 100'}.`,
    );
  }
  const max = MAX_ROTATION[unit];
  const sign = unit === 'deg' ? '°' : ' %';
  const inRange: typeof raw = [];
  const byLine = new Map(raw.map((p) => [p.line, p]));
  for (const { row, value } of rotations) {
    if (value === null) continue;
    if (value < 0 || value > max) {
      rot.problem(row, `${formatNumber(value)}${sign} is outside the rotation range 0–${max}${sign}.`);
    } else {
      const p = byLine.get(row.line);
      if (p) inRange.push(p);
    }
  }
  const points = sortAndFindRepeats(inRange, mapping.rotation!.header, 'rotation', sign, issues);
  if (issues.length > 0) return { ok: false, issues: capIssues(issues) };
  return {
    ok: true,
    kind: 'taper',
    points,
    rotationUnit: unit,
    columns: columnsUsed(mapping, ROLES_OF.taper),
    ignored: [],
    rowCount: rows.length,
    notes,
  };
}

function readImpedance(rows: TableRow[], mapping: ColumnMapping, decimalComma: boolean, ragged: CsvIssue[]): ImpedanceSweepResult {
  const issues: CsvIssue[] = [...ragged];
  const polar = Boolean(mapping.magnitude && mapping.phase);
  const freq = new ColumnReader(mapping.frequency!, decimalComma, issues);
  const a = new ColumnReader((polar ? mapping.magnitude : mapping.re)!, decimalComma, issues);
  const b = new ColumnReader((polar ? mapping.phase : mapping.im)!, decimalComma, issues);
  const rad = polar && mapping.phase!.angleUnit === 'rad';
  const phaseLimit = rad ? Math.PI : 180;

  const raw: { x: number; line: number; point: CoilPoint }[] = [];
  for (const row of rows) {
    const f = freq.read(row);
    if (f !== null && f <= 0) freq.problem(row, `${formatNumber(f / freq.info.scale)} is not a frequency: it must be greater than zero.`);
    const va = a.read(row);
    const vb = b.read(row);
    let bad = f === null || f <= 0 || va === null || vb === null;
    if (polar && va !== null && va <= 0) {
      a.problem(row, `${formatNumber(va / a.info.scale)} is not an impedance magnitude: it must be greater than zero.`);
      bad = true;
    }
    if (polar && vb !== null && Math.abs(vb) > phaseLimit) {
      b.problem(row, `the phase ${formatNumber(vb)}${rad ? ' rad' : '°'} is outside ±${rad ? 'π rad' : '180°'}.`);
      bad = true;
    }
    if (bad) continue;
    const point: CoilPoint = polar
      ? { frequency: f!, magnitude: va!, phaseDeg: rad ? (vb! * 180) / Math.PI : vb! }
      : { frequency: f!, re: va!, im: vb! };
    raw.push({ x: f!, line: row.line, point });
  }
  const points = sortAndFindRepeats(raw, mapping.frequency!.header, 'frequency', ' Hz', issues);
  if (issues.length > 0) return { ok: false, issues: capIssues(issues) };
  const roles: ColumnRole[] = polar ? ['frequency', 'magnitude', 'phase'] : ['frequency', 're', 'im'];
  return { ok: true, kind: 'impedance', points, columns: columnsUsed(mapping, roles), ignored: [], rowCount: rows.length, notes: [] };
}
