// Filtering and sorting a lot's items (the items table works on index arrays over the server's
// columns). Hand-worked cases on a small lot: nominal 100 Ω ±10 %, limits 90 … 110.
import { describe, expect, it } from 'vitest';
import { filterRows, NO_FILTERS, sortRows, type ItemFilters } from '@/features/lots/components/lot-item-rows';
import type { LotItems, LotStats } from '@/features/lots/api/types';

const items: LotItems = {
  ids: [11, 12, 13, 14, 15, 16],
  items: ['10', '2', '1', '33', '4', '5'],
  values: [100, 85, 112, 100, 95, 130],
  second: [0.01, null, 0.03, 0.02, null, 0.05],
  deviationsPct: [0, -15, 12, 0, -5, 30],
  bin: [4, 0, 7, 4, 3, 8],
  set: [0, -1, -1, 0, 1, -1],
  outlier: [0, 0, 0, 0, 0, 1],
  secondFail: [0, 0, 1, 0, 0, 1],
  partIds: [null, null, null, null, null, null],
};
const stats = { lower: 90, upper: 110 } as LotStats;
const rows = (f: Partial<ItemFilters>) => Array.from(filterRows(items, stats, { ...NO_FILTERS, ...f }));

describe('filterRows', () => {
  it('no filter keeps every row in upload order', () => {
    expect(rows({})).toEqual([0, 1, 2, 3, 4, 5]);
  });

  it('tolerance: outside is below the lower or above the upper limit; a value on a limit is inside', () => {
    expect(rows({ tolerance: 'out' })).toEqual([1, 2, 5]);
    expect(rows({ tolerance: 'in' })).toEqual([0, 3, 4]);
    const onLimits: LotItems = { ...items, values: [90, 110, 89.999, 110.001, 100, 100] };
    expect(Array.from(filterRows(onLimits, stats, { ...NO_FILTERS, tolerance: 'out' }))).toEqual([2, 3]);
  });

  it('outliers, second-quantity failures and one deviation bin', () => {
    expect(rows({ outlier: true })).toEqual([5]);
    expect(rows({ secondFail: true })).toEqual([2, 5]);
    expect(rows({ bin: 4 })).toEqual([0, 3]);
  });

  it('matched sets: in any set, in none, or one set by number', () => {
    expect(rows({ set: 'in' })).toEqual([0, 3, 4]);
    expect(rows({ set: 'none' })).toEqual([1, 2, 5]);
    expect(rows({ set: 0 })).toEqual([0, 3]);
    expect(rows({ set: 1 })).toEqual([4]);
  });

  it('filters combine (all must hold)', () => {
    expect(rows({ tolerance: 'out', secondFail: true })).toEqual([2, 5]);
    expect(rows({ tolerance: 'out', secondFail: true, outlier: true })).toEqual([5]);
    expect(rows({ tolerance: 'in', set: 'none' })).toEqual([]);
  });
});

describe('sortRows', () => {
  const all = filterRows(items, stats, NO_FILTERS);

  it('unsorted keeps the filtered order', () => {
    expect(sortRows(all, items, [])).toEqual([0, 1, 2, 3, 4, 5]);
  });

  it('by value, ties in upload order; descending is the exact reverse', () => {
    expect(sortRows(all, items, [{ id: 'value', desc: false }])).toEqual([1, 4, 0, 3, 2, 5]);
    expect(sortRows(all, items, [{ id: 'value', desc: true }])).toEqual([5, 2, 3, 0, 4, 1]);
  });

  it('item names that are all numbers sort as numbers (2 before 10), otherwise naturally', () => {
    expect(sortRows(all, items, [{ id: 'item', desc: false }]).map((i) => items.items[i])).toEqual(['1', '2', '4', '5', '10', '33']);
    const named: LotItems = { ...items, items: ['B-10', 'B-2', 'A-1', 'B-33', 'A-4', 'A-10'] };
    expect(sortRows(all, named, [{ id: 'item', desc: false }]).map((i) => named.items[i])).toEqual([
      'A-1',
      'A-4',
      'A-10',
      'B-2',
      'B-10',
      'B-33',
    ]);
  });

  it('a missing second reading sorts below every reading', () => {
    expect(sortRows(all, items, [{ id: 'second', desc: false }])).toEqual([1, 4, 0, 3, 2, 5]);
  });

  it('sorts only the rows the filters kept', () => {
    const out = filterRows(items, stats, { ...NO_FILTERS, tolerance: 'out' });
    expect(sortRows(out, items, [{ id: 'deviation', desc: true }])).toEqual([5, 2, 1]);
  });
});
