// Display helpers shared by screens. Numbers go through shared/units so the client and the
// server's e-mails write values the same way.
import type { PartKind } from '@shared/schemas/common';
import { toleranceWords } from '@shared/analysis/tolerance';
import { NOMINAL_QUANTITY } from '@shared/schemas/parts';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';

/** A part's nominal in engineering notation with the unit of its kind: 500000, pot → "500 kΩ". */
export function formatNominal(kind: PartKind, nominal: number | null | undefined): string {
  if (nominal === null || nominal === undefined) return '—';
  return formatValue(nominal, QUANTITY_UNIT[NOMINAL_QUANTITY[kind]]);
}

/** "±5 %", or "−20 %/+80 %" when the sides differ (a Z part); "—" without a tolerance. */
export function formatTolerance(pct: number | null | undefined, plusPct?: number | null): string {
  if (pct === null || pct === undefined) return '—';
  return toleranceWords(pct, plusPct);
}

/** A tolerance as form text: "5", or "−20/+80" when the sides differ; blank without one. */
export function toleranceText(pct: number | null | undefined, plusPct?: number | null): string {
  if (pct === null || pct === undefined) return '';
  const plus = plusPct ?? pct;
  return plus === pct ? String(pct) : `−${pct}/+${plus}`;
}

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
const dateOnly = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });

/** Server timestamps are milliseconds since the epoch. */
export const formatDateTime = (ms: number | null | undefined) => (ms ? dateTime.format(new Date(ms)) : '—');
export const formatDate = (ms: number | null | undefined) => (ms ? dateOnly.format(new Date(ms)) : '—');

export const ROLE_LABEL = { admin: 'Admin', qa: 'QA lead', tech: 'Bench tech', viewer: 'Viewer' } as const;
