// Speed of lot statistics and value parsing (docs/computation.md §5 and §7). Each figure is printed
// beside a reference measured in the same run: a plain Float64Array sort of the same 100 000
// values, the one n log n step the statistics cannot avoid.
import { lotStatistics } from '@shared/analysis/lot-stats';
import { parseValue } from '@shared/units/parse';
import { timeMedian, type BenchFigure } from './report';
import { seededRandom } from '@shared/random/seeded';

function readings(n: number): Float64Array {
  const r = seededRandom(2024);
  const x = new Float64Array(n);
  // A 500 kΩ lot with a roughly normal spread (sum of three uniforms), as a meter would read it.
  for (let i = 0; i < n; i++) x[i] = Math.round((500e3 * (1 + 0.05 * (r() + r() + r() - 1.5))) / 10) * 10;
  return x;
}

const ms = (t: number) => `${t.toFixed(2)} ms`;

export async function bench(): Promise<BenchFigure[]> {
  const n = 100_000;
  const x = readings(n);
  const sortRef = timeMedian(() => x.slice().sort(), 21, 5);

  const tStats = timeMedian(() => lotStatistics({ values: x, nominal: 500e3, tolerancePct: 10 }), 21, 5);
  const tMatch = timeMedian(() => lotStatistics({ values: x, nominal: 500e3, tolerancePct: 10, matchPct: 0.1, setSize: 2 }), 11, 3);

  const r = seededRandom(7);
  const forms = ['22n', '0,022 µF', '4k7', '470K', '6.2 kΩ', '1meg', '2.2e-8', '100pF', 'R47', '2.5 H'];
  const texts = Array.from({ length: 100_000 }, (_, i) => forms[i % forms.length]!);
  const plain = Array.from({ length: 100_000 }, () => String(r() * 1e6));
  const tParse = timeMedian(
    () => {
      for (const t of texts) parseValue(t);
    },
    7,
    2,
  );
  const tNumber = timeMedian(
    () => {
      let s = 0;
      for (const t of plain) s += Number(t);
      return s;
    },
    21,
    5,
  );

  return [
    {
      name: 'lot statistics, 100 000 readings (no matching)',
      measured: ms(tStats),
      reference: `plain Float64Array sort of the same values ${ms(sortRef)} (ratio ${(tStats / sortRef).toFixed(2)}×)`,
      goal: '≤ 30 ms',
      met: tStats <= 30,
    },
    {
      name: 'lot statistics with matched pairs within 0.1 %, 100 000 readings',
      measured: ms(tMatch),
      reference: `plain Float64Array sort ${ms(sortRef)} (ratio ${(tMatch / sortRef).toFixed(2)}×)`,
      goal: '≤ 1 s (docs/computation.md §5: well under a second)',
      met: tMatch <= 1000,
    },
    {
      name: 'parseValue, 100 000 engineering-notation strings (a lot typed with units)',
      measured: ms(tParse),
      reference: `Number() on 100 000 plain decimal strings ${ms(tNumber)} (ratio ${(tParse / tNumber).toFixed(1)}×)`,
      goal: '≤ 250 ms (chosen here: a quarter of the 1 s lot budget of docs/computation.md §7)',
      met: tParse <= 250,
    },
  ];
}
