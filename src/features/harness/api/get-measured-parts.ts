// Measured parts a harness can take its values from: pickups with a coil fit, pots with a taper
// fit. The list route has no "has a fit" filter, so the parts of the kind are listed and their fits
// asked for one by one — only when the user opens the chooser, and for at most MEASURED_LIMIT parts.
import { useQueries, useQuery } from '@tanstack/react-query';
import type { CoilFit } from '@shared/analysis/coil';
import type { TaperFit } from '@shared/analysis/taper';
import type { Part } from '@shared/schemas/parts';
import type { Fit } from '@shared/schemas/sweeps';
import { TAPER_LAWS } from '@shared/taper/law';
import { partFitsQueryOptions, partQueryOptions, partsQueryOptions } from '@/data/parts';

export const MEASURED_LIMIT = 100;

type MeasuredKind = 'pickup' | 'pot';
const FIT_KIND = { pickup: 'coil', pot: 'taper' } as const;

/** The parts of the kind the chooser looks at: the parts list's query with a kind and a limit. */
export const partsOfKindQueryOptions = (kind: MeasuredKind) => partsQueryOptions({ kind, limit: MEASURED_LIMIT });

/** The label of a part a saved design refers to (the part page's query). */
export const usePartLabel = (partId: number | undefined) => {
  const q = useQuery({ ...partQueryOptions(partId ?? 0), enabled: partId !== undefined });
  return q.data?.label;
};

/** The newest fit of the kind that no later fit of its sweep has replaced. */
export function latestFit(fits: readonly Fit[], kind: 'taper' | 'coil'): Fit | undefined {
  return fits.filter((f) => f.kind === kind && f.supersededAt === null).sort((a, b) => b.createdAt - a.createdAt || b.id - a.id)[0];
}

export type MeasuredPickup = { part: Part; fit: Fit; coil: Pick<CoilFit, 'R' | 'L' | 'C' | 'Rp'> };
export type MeasuredPot = { part: Part; fit: Fit; taper: Pick<TaperFit, 'law' | 'm' | 'total'> };

export interface MeasuredList<T> {
  items: T[];
  pending: boolean;
  error: Error | null;
  /** Parts of the kind looked at (the chooser says when the list was cut at MEASURED_LIMIT). */
  looked: number;
}

function useMeasured(kind: MeasuredKind, enabled: boolean) {
  const parts = useQuery({ ...partsOfKindQueryOptions(kind), enabled });
  const list = parts.data?.parts ?? [];
  const fits = useQueries({
    queries: list.map((p) => ({ ...partFitsQueryOptions(p.id), enabled })),
  });
  const pending = enabled && (parts.isPending || fits.some((f) => f.isPending));
  const error = parts.error ?? fits.find((f) => f.error)?.error ?? null;
  const withFits = list.flatMap((part, i) => {
    const fit = latestFit(fits[i]?.data?.fits ?? [], FIT_KIND[kind]);
    return fit ? [{ part, fit }] : [];
  });
  return { withFits, pending, error, looked: list.length };
}

const num = (v: unknown): number | undefined => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);

export function useMeasuredPickups(enabled: boolean): MeasuredList<MeasuredPickup> {
  const { withFits, ...rest } = useMeasured('pickup', enabled);
  const items = withFits.flatMap(({ part, fit }) => {
    if (fit.kind !== 'coil') return [];
    const R = num(fit.result.R);
    const L = num(fit.result.L);
    const C = num(fit.result.C);
    if (R === undefined || L === undefined || C === undefined) return [];
    return [{ part, fit, coil: { R, L, C, Rp: num(fit.result.Rp) ?? null } }];
  });
  return { items, ...rest };
}

export function useMeasuredPots(enabled: boolean): MeasuredList<MeasuredPot> {
  const { withFits, ...rest } = useMeasured('pot', enabled);
  const items = withFits.flatMap(({ part, fit }) => {
    if (fit.kind !== 'taper') return [];
    const law = TAPER_LAWS.find((l) => l === fit.result.law);
    const m = num(fit.result.m);
    const total = num(fit.result.total);
    if (!law || m === undefined || total === undefined) return [];
    return [{ part, fit, taper: { law, m, total } }];
  });
  return { items, ...rest };
}
