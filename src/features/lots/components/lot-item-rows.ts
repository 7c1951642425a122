// Filtering and sorting a lot's items as index arrays over the server's columns (no object per
// item): pure functions, used by the items table and checked in tests/src/.
import type { SortingState } from '@tanstack/react-table';
import type { LotItems, LotStats } from '../api/types';

export interface ItemFilters {
  tolerance: 'all' | 'out' | 'in';
  outlier: boolean;
  secondFail: boolean;
  /** Deviation-bin index, or -1 for all. */
  bin: number;
  /** 'any', 'in' (in some matched set), 'none', or a set number S1 = 0. */
  set: 'any' | 'in' | 'none' | number;
}

export const NO_FILTERS: ItemFilters = { tolerance: 'all', outlier: false, secondFail: false, bin: -1, set: 'any' };

/** Row indices that pass the filters, in upload order. */
export function filterRows(items: LotItems, stats: LotStats, f: ItemFilters): Int32Array {
  const n = items.values.length;
  const out = new Int32Array(n);
  let k = 0;
  const { lower, upper } = stats;
  for (let i = 0; i < n; i++) {
    const v = items.values[i]!;
    const outside = v < lower || v > upper;
    if (f.tolerance === 'out' && !outside) continue;
    if (f.tolerance === 'in' && outside) continue;
    if (f.outlier && !items.outlier[i]) continue;
    if (f.secondFail && !items.secondFail[i]) continue;
    if (f.bin >= 0 && items.bin[i] !== f.bin) continue;
    const s = items.set[i]!;
    if (f.set === 'in' && s < 0) continue;
    if (f.set === 'none' && s >= 0) continue;
    if (typeof f.set === 'number' && s !== f.set) continue;
    out[k++] = i;
  }
  return out.subarray(0, k);
}

export function sortRows(rows: Int32Array, items: LotItems, sorting: SortingState): number[] {
  const order = Array.from(rows);
  const s = sorting[0];
  if (!s) return order;
  const dir = s.desc ? -1 : 1;
  const numKey = (arr: ArrayLike<number | null>) => (a: number, b: number) => {
    const x = arr[a] ?? -Infinity;
    const y = arr[b] ?? -Infinity;
    return (x < y ? -1 : x > y ? 1 : a - b) * dir;
  };
  switch (s.id) {
    case 'item': {
      // Item names are usually numbers ("1" … "100000"): compare them as numbers when they all are.
      const asNum = items.items.map((t) => (/^\s*-?\d+(\.\d+)?\s*$/.test(t) ? Number(t) : NaN));
      if (asNum.every((x) => !Number.isNaN(x))) return order.sort(numKey(asNum));
      const collator = new Intl.Collator(undefined, { numeric: true });
      return order.sort((a, b) => collator.compare(items.items[a]!, items.items[b]!) * dir);
    }
    case 'value':
    case 'deviation':
      return order.sort(numKey(items.values));
    case 'second':
      return order.sort(numKey(items.second));
    case 'bin':
      return order.sort(numKey(items.bin));
    case 'set':
      return order.sort(numKey(items.set));
    default:
      return order;
  }
}
