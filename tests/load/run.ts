// `npm run load`: a bounded load figure anyone can reproduce. Starts the app (tsx server/index.ts) on a
// temporary data folder with the demo workshop, on loopback only, then runs each scenario for a fixed
// duration at a fixed concurrency while one probe calls /api/health every 50 ms. Prints req/s, p50/p99
// of the scenario and p50/p99 of /api/health. Nothing is sent anywhere but 127.0.0.1.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

const PORT = 3900 + Math.floor(Math.random() * 90);
const BASE = `http://127.0.0.1:${PORT}`;
const DURATION_MS = Number(process.env.LOAD_SECONDS ?? 10) * 1000;
const CONCURRENCY = 8;
const PASSWORD = 'load-test-passphrase';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-load-'));
const child = spawn('npx', ['tsx', 'server/index.ts'], {
  env: {
    ...process.env,
    PORT: String(PORT),
    LUGBOOK_DATA_DIR: dataDir,
    LUGBOOK_DEMO_PASSWORD: PASSWORD,
    LUGBOOK_REQUEST_LOG: 'false',
    PUBLIC_URL: BASE,
    NODE_ENV: 'development',
  },
  stdio: ['ignore', 'pipe', 'inherit'],
});
const stop = () => {
  child.kill('SIGTERM');
  fs.rmSync(dataDir, { recursive: true, force: true });
};
process.on('exit', stop);

async function waitForServer() {
  for (let i = 0; i < 600; i++) {
    try {
      if ((await fetch(`${BASE}/api/health`)).ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error('the server did not start');
}

const pct = (sorted: number[], p: number) =>
  sorted.length ? sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]! : NaN;

async function scenario(name: string, call: () => Promise<Response>) {
  const times: number[] = [];
  const health: number[] = [];
  let errors = 0;
  const until = performance.now() + DURATION_MS;
  const worker = async () => {
    while (performance.now() < until) {
      const t0 = performance.now();
      try {
        const res = await call();
        await res.arrayBuffer();
        if (!res.ok) errors++;
      } catch {
        // A reset or refused connection counts as an error, with its time.
        errors++;
      }
      times.push(performance.now() - t0);
    }
  };
  const probe = async () => {
    while (performance.now() < until) {
      const t0 = performance.now();
      await (await fetch(`${BASE}/api/health`)).arrayBuffer();
      health.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 50));
    }
  };
  await Promise.all([...Array.from({ length: CONCURRENCY }, worker), probe()]);
  times.sort((a, b) => a - b);
  health.sort((a, b) => a - b);
  const f = (x: number) => x.toFixed(1).padStart(8);
  console.log(
    `${name.padEnd(28)} ${(times.length / (DURATION_MS / 1000)).toFixed(1).padStart(8)} req/s  p50 ${f(pct(times, 50))} ms  p99 ${f(pct(times, 99))} ms  errors ${errors}   /api/health p50 ${f(pct(health, 50))} ms  p99 ${f(pct(health, 99))} ms`,
  );
}

async function main() {
  await waitForServer();
  const signIn = await fetch(`${BASE}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: BASE },
    body: JSON.stringify({ email: 'qa@lugbook.test', password: PASSWORD }),
  });
  if (!signIn.ok) throw new Error(`sign-in failed: ${signIn.status}`);
  const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0]!;
  const headers = { Cookie: cookie, Origin: BASE, 'Accept-Encoding': 'gzip' };
  const lots = (await (await fetch(`${BASE}/api/lots`, { headers })).json()) as { lots: { id: number; count: number }[] };
  const big = lots.lots.reduce((a, b) => (b.count > a.count ? b : a));
  console.log(
    `Lugbook load: ${CONCURRENCY} concurrent clients, ${DURATION_MS / 1000} s per scenario, loopback; big lot ${big.id} with ${big.count} items; ${os.cpus().length} CPUs`,
  );
  await scenario('GET /api/parts', () => fetch(`${BASE}/api/parts`, { headers }));
  await scenario(`GET /api/lots/:id (${big.count})`, () => fetch(`${BASE}/api/lots/${big.id}`, { headers }));
  await scenario('GET /api/lots/:id/items', () => fetch(`${BASE}/api/lots/${big.id}/items`, { headers }));
  await scenario('POST /api/harness/sweep', () =>
    fetch(`${BASE}/api/harness/sweep`, {
      method: 'POST',
      headers: { ...headers, 'Content-Type': 'application/json' },
      body: JSON.stringify({ preset: 'bleed-cap' }),
    }),
  );
  const csv = ['Item,C (nF)', ...Array.from({ length: 2000 }, (_, i) => `${i + 1},${(47 * (1 + 0.02 * Math.sin(i))).toFixed(4)}`)].join(
    '\n',
  );
  await scenario('POST lot upload (2,000 rows)', async () => {
    const lot = (await (
      await fetch(`${BASE}/api/lots`, {
        method: 'POST',
        headers: { ...headers, 'Content-Type': 'application/json' },
        body: JSON.stringify({ kind: 'capacitor', marking: '473J' }),
      })
    ).json()) as { id: number };
    const form = new FormData();
    form.append('file', new Blob([csv], { type: 'text/csv' }), 'lot.csv');
    return fetch(`${BASE}/api/lots/${lot.id}/readings`, { method: 'POST', headers, body: form });
  });
}

main()
  .then(() => process.exit(0))
  .catch((err) => {
    console.error(err);
    process.exit(1);
  });
