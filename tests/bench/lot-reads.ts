// Reading a 100,000-item lot through the real HTTP routes (GET /api/lots/:id and /api/lots/:id/items),
// which send the statistics stored when the readings changed (server/features/lots/stored-stats.ts),
// beside references measured in the same run: a plain SELECT of the lot's rows, and the fresh
// computation the routes used to do on every read.
import { createTestApp } from '../support/app';
import { lotResults } from '@server/features/lots/stored-stats';
import { lotValues } from '@server/features/lots/repository';
import type { BenchFigure } from './report';

const ROWS = 100_000;

function lotCsv(): string {
  const lines = ['Item,C (nF),D'];
  for (let i = 1; i <= ROWS; i++) lines.push(`${i},${(22 * (1 + 0.03 * Math.sin(i * 0.7) + 0.01 * Math.cos(i * 1.3))).toFixed(4)},0.0008`);
  return lines.join('\n') + '\n';
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

async function timed(runs: number, f: () => Promise<unknown> | unknown): Promise<number> {
  await f();
  const ts: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    await f();
    ts.push(performance.now() - t0);
  }
  return median(ts);
}

export async function bench(): Promise<BenchFigure[]> {
  const t = await createTestApp();
  try {
    const qa = await t.as('qa');
    const lot = (
      await qa
        .post('/api/lots')
        .send({ kind: 'capacitor', nominal: 22e-9, tolerancePct: 10, secondQuantity: 'dissipation', secondLimit: 0.01, code: 'BENCH-READ' })
    ).body;
    const up = await qa.post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(lotCsv()), 'lot.csv');
    if (up.status !== 201) throw new Error(`bench upload failed: ${up.status}`);
    const viewer = await t.as('viewer');
    const get = async (url: string, encoding: string) => {
      // Taken as bytes: the figure is the server's answer, not the client parsing 9 MB of JSON.
      const res = await viewer.get(url).set('Accept-Encoding', encoding).responseType('arraybuffer');
      if (res.status !== 200) throw new Error(`bench read failed: ${res.status}`);
    };
    const sqlite = t.ctx.sqlite;
    const lotRow = { ...lot, nominal: 22e-9, tolerancePct: 10, secondLimit: 0.01 };
    const select = await timed(9, () =>
      sqlite.prepare('select id, item, value, second_value from lot_readings where lot_id = ? order by id').raw(true).all(lot.id),
    );
    const recompute = await timed(5, () => lotResults(lotRow, lotValues(sqlite, lot.id), { matchPct: 1, setSize: 2 }));
    const detail = await timed(15, () => get(`/api/lots/${lot.id}`, 'identity'));
    const items = await timed(9, () => get(`/api/lots/${lot.id}/items`, 'identity'));
    // The stored compressed copies (made in the pool after the upload; the first read waits for them).
    const itemsGzip = await timed(5, () => get(`/api/lots/${lot.id}/items`, 'gzip'));
    const itemsBr = await timed(5, () => get(`/api/lots/${lot.id}/items`, 'br'));
    const ms = (x: number) => `${x.toFixed(1)} ms`;
    return [
      {
        name: 'lot detail of 100,000 items (stored statistics), GET /api/lots/:id through HTTP, uncompressed',
        measured: ms(detail),
        reference: `plain SELECT of the lot's 100,000 rows ${ms(select)}; computing statistics, sets and columns afresh (what each read did before) ${ms(recompute)}`,
        goal: '≤ 10 ms',
        met: detail <= 10,
      },
      {
        name: 'lot items of 100,000 items (stored columns), GET /api/lots/:id/items through HTTP, uncompressed',
        measured: ms(items),
        reference: `plain SELECT of the rows ${ms(select)}; fresh computation ${ms(recompute)}; the same route sending its stored gzip copy ${ms(itemsGzip)}, brotli copy ${ms(itemsBr)} (both decoded by this bench's own client, in the same process)`,
        goal: '≤ 100 ms',
        met: items <= 100,
      },
    ];
  } finally {
    t.close();
  }
}
