// What every lot route module shares: the kinds, their units and quantities, the summary shape, finding a lot.
import type { AppContext } from '@server/context';
import { notFound } from '@server/http/errors';
import { LOT_KINDS, type Lot } from '@shared/schemas/lots';
import { findLot, type LotRow } from './repository';

export type LotKind = (typeof LOT_KINDS)[number];
export const UNIT: Record<LotKind, string> = { capacitor: 'F', pot: 'Ω', resistor: 'Ω' };
export const QUANTITY = { capacitor: 'capacitance', pot: 'resistance', resistor: 'resistance' } as const satisfies Record<LotKind, string>;
/** Lots hold capacitors, pots or resistors only (the lot kinds of shared/schemas/lots.ts). */
export const lotKind = (lot: LotRow) => lot.kind as LotKind;

/** The lot as the API sends it (shared/schemas/lots.ts `Lot`). */
export function lotSummary(lot: LotRow): Lot {
  // The stored reading count goes out as the answers' `count`, where a route gives one.
  const { readingCount: _readingCount, ...row } = lot;
  return { ...row, kind: lotKind(lot), unit: UNIT[lotKind(lot)] };
}

/** The lot with that id, or a 404. */
export function lotFinder(ctx: AppContext) {
  return (id: number): LotRow => {
    const lot = findLot(ctx.db, id);
    if (!lot) throw notFound('That lot');
    return lot;
  };
}
