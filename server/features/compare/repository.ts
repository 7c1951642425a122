// Resolves a comparison's selection to the pots that have a current taper fit, with their fitted
// parameters and (for the taper comparison) their measured curves, and lists what a selection can be
// made of. The curves read every selected pot's sweep (up to 20,000 points each): that runs in a pool
// worker (compute.ts); the CSV export needs the fits only and reads no sweep.
import type Database from 'better-sqlite3';
import { and, desc, eq, inArray, isNull } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { fits, lots, parts } from '@server/db/schema';
import { statement } from '@server/db/statements';
import type { FitRow } from '@server/features/sweeps/fit';
import { normalisedCurve, type ComparePot } from '@shared/analysis/compare';
import type { CoilFit } from '@shared/analysis/coil';
import type { TaperFit } from '@shared/analysis/taper';
import type { CompareSelection } from '@shared/schemas/compare';

type PartRow = typeof parts.$inferSelect;

/** The newest current (not superseded) fit of a kind for each of the given parts. */
function currentFits(db: DbLike, kind: 'taper' | 'coil', partIds?: number[]): Map<number, FitRow> {
  const where = [eq(fits.kind, kind), isNull(fits.supersededAt)];
  if (partIds) where.push(inArray(fits.partId, partIds));
  const rows = db
    .select()
    .from(fits)
    .where(and(...where))
    .orderBy(desc(fits.id))
    .all();
  const byPart = new Map<number, FitRow>();
  for (const r of rows) if (!byPart.has(r.partId)) byPart.set(r.partId, r);
  return byPart;
}

const DAY_MS = 86_400_000;
const dayStart = (iso: string) => Date.parse(`${iso}T00:00:00Z`);

/** A tag word of the part's free-text tags (split on commas, semicolons and spaces). */
function hasTag(tags: string | null, tag: string): boolean {
  if (!tags) return false;
  const want = tag.toLowerCase();
  return tags
    .toLowerCase()
    .split(/[,;\s]+/)
    .some((t) => t === want);
}

function hasFilter(s: CompareSelection): boolean {
  return Boolean(
    s.lotIds?.length || s.suppliers?.length || s.nominal !== undefined || s.taperClasses?.length || s.createdFrom || s.createdTo || s.tag,
  );
}

/** Whether a pot passes every filter of the selection. */
function matchesFilters(p: PartRow, s: CompareSelection): boolean {
  if (s.lotIds?.length && (p.lotId === null || !s.lotIds.includes(p.lotId))) return false;
  if (s.suppliers?.length && (p.supplier === null || !s.suppliers.includes(p.supplier))) return false;
  if (s.nominal !== undefined && (p.nominal === null || Math.abs(p.nominal - s.nominal) > 0.005 * s.nominal)) return false;
  if (s.taperClasses?.length && (p.taperClass === null || !(s.taperClasses as string[]).includes(p.taperClass))) return false;
  if (s.createdFrom && p.createdAt < dayStart(s.createdFrom)) return false;
  if (s.createdTo && p.createdAt >= dayStart(s.createdTo) + DAY_MS) return false;
  if (s.tag && !hasTag(p.tags, s.tag)) return false;
  return true;
}

/** Pots with a current taper fit, each with its lot code. */
function fittedPots(db: DbLike): { part: PartRow; lotCode: string | null; fit: FitRow }[] {
  const rows = db
    .select({ part: parts, lotCode: lots.code })
    .from(parts)
    .leftJoin(lots, eq(parts.lotId, lots.id))
    .where(eq(parts.kind, 'pot'))
    .orderBy(parts.label)
    .all();
  const fitByPart = currentFits(db, 'taper');
  return rows.flatMap((r) => {
    const fit = fitByPart.get(r.part.id);
    return fit ? [{ part: r.part, lotCode: r.lotCode, fit }] : [];
  });
}

type FittedPot = ReturnType<typeof fittedPots>[number];

/** A pot as a comparison shows it, without its measured curve. */
export type ComparePotFit = Omit<ComparePot, 'curve'>;

/**
 * The pots a selection names: those passing all its filters, plus any listed one by one. With no
 * filter and no part ids: every pot with a current taper fit. Pots without a current taper fit are
 * never included; `missing` lists part ids asked for one by one that have none (or are not pots).
 */
function chosenPots(db: DbLike, selection: CompareSelection): { chosen: FittedPot[]; missing: number[] } {
  const all = fittedPots(db);
  const filtered = hasFilter(selection);
  const explicit = new Set(selection.partIds ?? []);
  const chosen = all.filter(({ part }) => (filtered ? matchesFilters(part, selection) : explicit.size === 0) || explicit.has(part.id));
  const found = new Set(all.map((r) => r.part.id));
  const missing = [...explicit].filter((id) => !found.has(id));
  return { chosen, missing };
}

function potFit({ part, lotCode, fit }: FittedPot): ComparePotFit {
  const result = fit.result as unknown as TaperFit;
  return {
    partId: part.id,
    label: part.label,
    lotId: part.lotId,
    lotCode,
    supplier: part.supplier,
    nominal: part.nominal,
    taperClass: part.taperClass,
    taperM: part.taperM,
    fit: {
      law: result.law,
      m: result.m,
      r2: result.r2,
      rmsPct: result.rmsPct,
      maxPct: result.maxPct,
      total: result.total,
      totalDeviationPct: result.totalDeviationPct,
      endResistance: result.endResistance,
    },
  };
}

/** The selection's pots with their fitted parameters only (the CSV export): no sweep is read. */
export function resolveSelectionFits(db: DbLike, selection: CompareSelection): { pots: ComparePotFit[]; missing: number[] } {
  const { chosen, missing } = chosenPots(db, selection);
  return { pots: chosen.map(potFit), missing };
}

/**
 * The selection's pots with their measured curves, each from its fit's sweep: rows read as they are
 * (no ORM mapping of 20,000 points per pot). Run in a pool worker (compute.ts).
 */
export function resolveSelection(
  { db, sqlite }: { db: DbLike; sqlite: Database.Database },
  selection: CompareSelection,
): { pots: ComparePot[]; missing: number[] } {
  const { chosen, missing } = chosenPots(db, selection);
  const points = statement(sqlite, 'select x, y as r from sweep_points where sweep_id = ? order by idx');
  const pots = chosen.map((pot) => {
    const rows = pot.fit.sweepId ? (points.all(pot.fit.sweepId) as { x: number; r: number }[]) : [];
    return { ...potFit(pot), curve: normalisedCurve(rows, (pot.fit.result as unknown as TaperFit).total) } satisfies ComparePot;
  });
  return { pots, missing };
}

/** What the selection panel offers: the fitted pots, their lots, suppliers, nominals and tags, and measured pickups. */
export function compareCandidates(db: DbLike) {
  const pots = fittedPots(db);
  const lotMap = new Map<number, { id: number; code: string; supplier: string | null; count: number }>();
  for (const { part, lotCode } of pots) {
    if (part.lotId === null) continue;
    const entry = lotMap.get(part.lotId) ?? { id: part.lotId, code: lotCode ?? `Lot ${part.lotId}`, supplier: null, count: 0 };
    entry.count++;
    entry.supplier ??= part.supplier;
    lotMap.set(part.lotId, entry);
  }
  const distinct = <T>(xs: (T | null)[]) => [...new Set(xs.filter((x): x is T => x !== null))];
  const tags = distinct(
    pots.flatMap(({ part }) =>
      (part.tags ?? '')
        .toLowerCase()
        .split(/[,;\s]+/)
        .filter(Boolean),
    ),
  );
  const pickupParts = db.select().from(parts).where(eq(parts.kind, 'pickup')).orderBy(parts.label).all();
  const coilFits = currentFits(
    db,
    'coil',
    pickupParts.map((p) => p.id),
  );
  const pickups = pickupParts.flatMap((p) => {
    const fit = coilFits.get(p.id);
    if (!fit) return [];
    const r = fit.result as unknown as CoilFit;
    return [{ id: p.id, label: p.label, R: r.R, L: r.L, C: r.C, Rp: r.Rp ?? null }];
  });
  return {
    pots: pots.map(({ part, lotCode, fit }) => ({
      id: part.id,
      label: part.label,
      lotId: part.lotId,
      lotCode,
      supplier: part.supplier,
      nominal: part.nominal,
      taperClass: part.taperClass,
      tags: part.tags,
      createdAt: part.createdAt,
      law: (fit.result as unknown as TaperFit).law,
      m: (fit.result as unknown as TaperFit).m,
    })),
    lots: [...lotMap.values()].sort((a, b) => a.code.localeCompare(b.code, undefined, { numeric: true })),
    suppliers: distinct(pots.map(({ part }) => part.supplier)).sort(),
    nominals: distinct(pots.map(({ part }) => part.nominal)).sort((a, b) => a - b),
    tags: tags.sort(),
    pickups,
  };
}
