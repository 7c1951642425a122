// `npm run load`: a bounded load figure anyone can reproduce. Starts the app (server/index.ts through tsx)
// on a temporary data folder with the demo workshop, on loopback only, then runs each scenario for a fixed
// duration at a fixed concurrency while one probe calls /api/health every 50 ms. Prints req/s, p50/p99
// of the scenario and p50/p99 of /api/health (the last scenario mixes one uploader of 100,000-row lots with
// clients creating parts; its p50/p99 are of both kinds of call together). Nothing is sent anywhere but 127.0.0.1.
// The probe runs in a thread of its own, so the clients' work here (reading megabytes of answers) does not
// delay its timer and count as the server's; GETs read the answer's bytes as sent (a compressed answer is
// not decoded here, as a browser decodes on its own machine).
// LOAD_SECONDS (10) sets the duration, LOAD_CLIENTS (8) the concurrency; LOAD_ONLY=<words> runs the scenarios whose name holds them;
// LOAD_NODE_ARGS adds options to the server's node (e.g. `--cpu-prof --cpu-prof-dir=/tmp/prof`).
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';

const PORT = 3900 + Math.floor(Math.random() * 90);
const BASE = `http://127.0.0.1:${PORT}`;
const DURATION_MS = Number(process.env.LOAD_SECONDS ?? 10) * 1000;
const CONCURRENCY = Number(process.env.LOAD_CLIENTS ?? 8);
const PASSWORD = 'load-test-passphrase';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-load-'));
// The server itself (not an npx wrapper), so that stopping it here stops it.
const ONLY = process.env.LOAD_ONLY;
const NODE_ARGS = (process.env.LOAD_NODE_ARGS ?? '').split(' ').filter(Boolean);
const child = spawn(process.execPath, [...NODE_ARGS, '--import', 'tsx', 'server/index.ts'], {
  env: {
    ...process.env,
    PORT: String(PORT),
    LUGBOOK_DATA_DIR: dataDir,
    LUGBOOK_DEMO_PASSWORD: PASSWORD,
    LUGBOOK_REQUEST_LOG: 'false',
    PUBLIC_URL: BASE,
    NODE_ENV: 'development',
  },
  // Its errors show here; its own lines (serving on…, closing) do not.
  stdio: ['ignore', 'ignore', 'inherit'],
});
const exited = new Promise((resolve) => child.once('exit', resolve));
const removeData = () => fs.rmSync(dataDir, { recursive: true, force: true });
process.on('exit', () => {
  child.kill('SIGTERM');
  removeData();
});
/** Stops the server and waits for it (it writes a CPU profile on the way out when LOAD_NODE_ARGS asks). */
async function stop() {
  child.kill('SIGTERM');
  await exited;
  removeData();
}

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

const agent = new http.Agent({ keepAlive: true, maxSockets: CONCURRENCY * 2 });

/** A GET whose answer is read as bytes, as sent (compressed or not): its status and size. */
function get(url: string, headers: Record<string, string>): Promise<{ ok: boolean; bytes: number }> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { agent, headers }, (res) => {
        let bytes = 0;
        res.on('data', (c: Buffer) => (bytes += c.length));
        res.on('end', () => resolve({ ok: res.statusCode! >= 200 && res.statusCode! < 300, bytes }));
        res.on('error', reject);
      })
      .on('error', reject);
  });
}

/** Calls /api/health every 50 ms for `ms` in a thread of its own; answers the sorted times. */
function healthProbe(ms: number): Promise<number[]> {
  const code = `
    const { parentPort, workerData } = require('node:worker_threads');
    const http = require('node:http');
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const once = () => new Promise((resolve, reject) => {
      const t0 = performance.now();
      http.get(workerData.url, { agent }, (res) => { res.resume(); res.on('end', () => resolve(performance.now() - t0)); }).on('error', reject);
    });
    (async () => {
      const times = [];
      const until = performance.now() + workerData.ms;
      while (performance.now() < until) {
        times.push(await once());
        await new Promise((r) => setTimeout(r, 50));
      }
      parentPort.postMessage(times.sort((a, b) => a - b));
    })();`;
  return new Promise((resolve, reject) => {
    const w = new Worker(code, { eval: true, workerData: { url: `${BASE}/api/health`, ms } });
    w.once('message', (times: number[]) => {
      resolve(times);
      void w.terminate();
    });
    w.once('error', reject);
  });
}

async function scenario(name: string, call: (client: number) => Promise<{ ok: boolean }>) {
  if (ONLY && !name.includes(ONLY)) return;
  const times: number[] = [];
  let errors = 0;
  const until = performance.now() + DURATION_MS;
  const worker = async (client: number) => {
    while (performance.now() < until) {
      const t0 = performance.now();
      try {
        const res = await call(client);
        if (!res.ok) errors++;
      } catch {
        // A reset or refused connection counts as an error, with its time.
        errors++;
      }
      times.push(performance.now() - t0);
    }
  };
  const [health] = await Promise.all([healthProbe(DURATION_MS), ...Array.from({ length: CONCURRENCY }, (_, i) => worker(i))]);
  times.sort((a, b) => a - b);
  const f = (x: number) => x.toFixed(1).padStart(8);
  const load = os
    .loadavg()
    .map((x) => x.toFixed(2))
    .join(' ');
  console.log(
    `${name.padEnd(28)} ${(times.length / (DURATION_MS / 1000)).toFixed(1).padStart(8)} req/s  p50 ${f(pct(times, 50))} ms  p99 ${f(pct(times, 99))} ms  errors ${errors}   /api/health p50 ${f(pct(health, 50))} ms  p99 ${f(pct(health, 99))} ms   load average ${load}`,
  );
}

/** A fetch whose answer is read to its end. */
async function done(res: Promise<Response>): Promise<{ ok: boolean }> {
  const r = await res;
  await r.arrayBuffer();
  return r;
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
  // The server computes the big lot's statistics and compressed items answer in the background after it
  // starts; the first read waits for them. The scenarios measure the reads that come after it.
  const t0 = performance.now();
  await get(`${BASE}/api/lots/${big.id}/items`, headers);
  console.log(`first read of the big lot's items (waits for the start-up statistics): ${(performance.now() - t0).toFixed(0)} ms`);
  await scenario('GET /api/parts', () => get(`${BASE}/api/parts`, headers));
  await scenario(`GET /api/lots/:id (${big.count})`, () => get(`${BASE}/api/lots/${big.id}`, headers));
  await scenario('GET /api/lots/:id/items', () => get(`${BASE}/api/lots/${big.id}/items`, headers));
  await scenario('POST /api/harness/sweep', () =>
    done(
      fetch(`${BASE}/api/harness/sweep`, {
        method: 'POST',
        headers: { ...headers, 'Content-Type': 'application/json' },
        body: JSON.stringify({ preset: 'bleed-cap' }),
      }),
    ),
  );
  /** A capacitor lot's CSV of `rows` invented readings around 47 nF. */
  const lotCsv = (rows: number) =>
    ['Item,C (nF)', ...Array.from({ length: rows }, (_, i) => `${i + 1},${(47 * (1 + 0.02 * Math.sin(i))).toFixed(4)}`)].join('\n');
  /** Creates a lot and uploads `csv` as its readings. */
  const uploadToNewLot = async (csv: string) => {
    const lot = (await (
      await fetch(`${BASE}/api/lots`, {
        method: 'POST',
        headers: { ...headers, 'Content-Type': 'application/json' },
        body: JSON.stringify({ kind: 'capacitor', marking: '473J' }),
      })
    ).json()) as { id: number };
    const form = new FormData();
    form.append('file', new Blob([csv], { type: 'text/csv' }), 'lot.csv');
    return done(fetch(`${BASE}/api/lots/${lot.id}/readings`, { method: 'POST', headers, body: form }));
  };
  const csv = lotCsv(2000);
  await scenario('POST lot upload (2,000 rows)', () => uploadToNewLot(csv));
  // One client stores 100,000-row lots (a pool worker holds SQLite's write lock about a second each) while
  // the others create parts, which write on the request thread: they take turns with the worker's writes.
  const bigCsv = lotCsv(100_000);
  let made = 0;
  await scenario('100,000-row upload + part edits', async (client) => {
    if (client === 0) return uploadToNewLot(bigCsv);
    return done(
      fetch(`${BASE}/api/parts`, {
        method: 'POST',
        headers: { ...headers, 'Content-Type': 'application/json' },
        body: JSON.stringify({ kind: 'resistor', label: `LOAD-R-${++made}`, nominal: 10e3, tolerancePct: 5 }),
      }),
    );
  });
}

main()
  .then(stop)
  .then(() => process.exit(0))
  .catch((err) => {
    console.error(err);
    process.exit(1);
  });
