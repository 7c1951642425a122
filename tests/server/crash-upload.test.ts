// kill -9 during a large lot upload, then a restart on the same data folder: the lot holds every
// row of the upload or none, SQLite's integrity check passes, and no file is left behind (nothing
// in uploads/incoming, no stored file without its attachment row, no attachment row without its
// file). The real server runs as a child process (node --import tsx server/index.ts); the moments
// are chosen deterministically: while the file is being received, the test has sent half the
// body and waits for the temporary file to grow; the other moments are the server's named pause
// points (server/http/pause-point.ts, LUGBOOK_PAUSE_AT), where it reports and blocks its thread
// until it is killed — half the rows inserted; every row inserted and the file moved into place
// but the transaction not committed; committed but not yet answered.
// 100,000 rows under CI=true (the size of the issue); 20,000 on developer runs, for time.
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createContext } from '@server/bootstrap';
import { seedDemo } from '@server/demo/seed';
import type { PausePoint } from '@server/http/pause-point';
import { incomingDir } from '@server/uploads/store';

const ROWS = process.env.CI ? 100_000 : 20_000;
const PASSWORD = 'crash-test-passphrase';
const root = fileURLToPath(new URL('../..', import.meta.url));

let dataDir: string;
let uploadsDir: string;
let dbFile: string;
let header: Buffer;
let body: Buffer;

beforeAll(async () => {
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-crash-'));
  uploadsDir = path.join(dataDir, 'uploads');
  dbFile = path.join(dataDir, 'lugbook.db');
  // The accounts only (no demo lots): the server started below finds users and seeds nothing.
  const ctx = createContext({ dbFile, uploadsDir, log: () => undefined });
  await seedDemo(ctx, { password: PASSWORD, studies: false });
  ctx.sqlite.close();
  // Generated once: 47 nF readings spread by ±2 %, a dissipation factor beside them.
  const lines = [];
  for (let i = 2; i <= ROWS; i++) lines.push(`${i},${(47 * (1 + 0.02 * Math.sin(i))).toFixed(4)},0.0010`);
  header = Buffer.from('Item,C (nF),D\n');
  body = Buffer.from(lines.join('\n') + '\n');
});

/**
 * The file of one test: its first item is named after the lot, so that each test's file has its
 * own content hash (a file already stored under the same hash would not be moved again).
 */
const csvFor = (lotId: number) => Buffer.concat([header, Buffer.from(`lot${lotId}-1,47.0000,0.0010\n`), body]);

afterAll(() => {
  for (const s of running) s.child.kill('SIGKILL');
  fs.rmSync(dataDir, { recursive: true, force: true });
});

interface Server {
  child: ChildProcess;
  base: string;
  port: number;
  output: () => string;
  exited: Promise<number | null>;
}
const running = new Set<Server>();

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

/** The server itself (not a wrapper process), so that its pid is the one kill -9 hits. */
async function startServer(pauseAt?: PausePoint): Promise<Server> {
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  let out = '';
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: {
      ...process.env,
      PORT: String(port),
      LUGBOOK_DATA_DIR: dataDir,
      LUGBOOK_SEED_DEMO: 'false',
      LUGBOOK_REQUEST_LOG: 'false',
      PUBLIC_URL: base,
      NODE_ENV: 'test',
      LUGBOOK_PAUSE_AT: pauseAt ?? '',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  const server: Server = { child, base, port, output: () => out, exited };
  running.add(server);
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the server exited early:\n${out}`);
    try {
      if ((await fetch(`${base}/api/health`)).ok) return server;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`the server did not start:\n${out}`);
}

async function kill9(server: Server) {
  server.child.kill('SIGKILL');
  await server.exited;
  running.delete(server);
}

async function stop(server: Server) {
  server.child.kill('SIGTERM');
  await server.exited;
  running.delete(server);
}

async function until(what: string, check: () => boolean, server: Server) {
  const deadline = Date.now() + 120_000;
  while (!check()) {
    if (server.child.exitCode !== null) throw new Error(`the server exited before ${what}:\n${server.output()}`);
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}:\n${server.output()}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

async function signIn(server: Server): Promise<Record<string, string>> {
  const res = await fetch(`${server.base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: server.base },
    body: JSON.stringify({ email: 'tech@lugbook.test', password: PASSWORD }),
  });
  expect(res.status).toBe(200);
  return { Cookie: (res.headers.get('set-cookie') ?? '').split(';')[0]!, Origin: server.base };
}

async function newLot(server: Server, headers: Record<string, string>): Promise<number> {
  const res = await fetch(`${server.base}/api/lots`, {
    method: 'POST',
    headers: { ...headers, 'Content-Type': 'application/json' },
    body: JSON.stringify({ kind: 'capacitor', marking: '473J', secondQuantity: 'dissipation', secondLimit: 0.01 }),
  });
  expect(res.status).toBe(201);
  return ((await res.json()) as { id: number }).id;
}

function upload(server: Server, headers: Record<string, string>, lotId: number): Promise<Response> {
  const form = new FormData();
  form.append('file', new Blob([csvFor(lotId)], { type: 'text/csv' }), 'crash-lot.csv');
  return fetch(`${server.base}/api/lots/${lotId}/readings`, { method: 'POST', headers, body: form });
}

const incomingFiles = () => (fs.existsSync(incomingDir(uploadsDir)) ? fs.readdirSync(incomingDir(uploadsDir)) : []);

/** Every file under uploads/ other than incoming/, as content hashes (names that are not hashes included). */
function storedFiles(): string[] {
  if (!fs.existsSync(uploadsDir)) return [];
  return fs
    .readdirSync(uploadsDir, { withFileTypes: true })
    .filter((d) => d.isDirectory() && d.name !== 'incoming')
    .flatMap((d) => fs.readdirSync(path.join(uploadsDir, d.name)));
}

function readDb<T>(work: (db: Database.Database) => T): T {
  const db = new Database(dbFile, { readonly: true });
  try {
    return work(db);
  } finally {
    db.close();
  }
}

const lotRows = (db: Database.Database, lotId: number) =>
  (db.prepare('select count(*) as n from lot_readings where lot_id = ?').get(lotId) as { n: number }).n;

/**
 * After the restart: the lot holds `expected` rows (all or none), and the folder is whole — the
 * integrity check, no temporary file, every stored file named by an attachment row and every
 * attachment row's file on disk, one attachment and one audit line for the lot exactly when its
 * rows are there, and the API's counts agree with the table.
 */
async function expectWhole(server: Server, lotId: number, expected: number) {
  const found = readDb((db) => ({
    integrity: db.pragma('integrity_check', { simple: true }),
    rows: lotRows(db, lotId),
    lotFiles: (db.prepare("select count(*) as n from attachments where owner_type = 'lot' and owner_id = ?").get(lotId) as { n: number }).n,
    audits: (
      db
        .prepare("select count(*) as n from audit_log where entity = 'lot' and entity_id = ? and action = 'lot.readings-uploaded'")
        .get(String(lotId)) as { n: number }
    ).n,
    hashes: (db.prepare('select distinct content_hash as h from attachments').all() as { h: string }[]).map((r) => r.h),
  }));
  expect(found.integrity).toBe('ok');
  expect(found.rows).toBe(expected);
  expect(found.lotFiles).toBe(expected > 0 ? 1 : 0);
  expect(found.audits).toBe(expected > 0 ? 1 : 0);
  expect(incomingFiles()).toEqual([]);
  expect(storedFiles().sort()).toEqual([...found.hashes].sort());

  const headers = await signIn(server);
  const list = (await (await fetch(`${server.base}/api/lots`, { headers })).json()) as { lots: { id: number; count: number }[] };
  expect(list.lots.find((l) => l.id === lotId)?.count).toBe(expected);
  const detail = await fetch(`${server.base}/api/lots/${lotId}`, { headers });
  expect(detail.status).toBe(200);
  expect(((await detail.json()) as { count: number }).count).toBe(expected);
}

/** A lot the crash left empty takes the same file whole on the next try. */
async function expectUploadsAgain(server: Server, lotId: number) {
  const headers = await signIn(server);
  const res = await upload(server, headers, lotId);
  expect(res.status).toBe(201);
  expect(((await res.json()) as { rows: number }).rows).toBe(ROWS);
  expect(readDb((db) => lotRows(db, lotId))).toBe(ROWS);
  expect(incomingFiles()).toEqual([]);
}

describe(`kill -9 during a ${ROWS.toLocaleString('en')}-row lot upload, then a restart`, { timeout: 300_000 }, () => {
  test('while the file is being received: no rows, and the temporary file is gone after the restart', async () => {
    const server = await startServer();
    const headers = await signIn(server);
    const lotId = await newLot(server, headers);
    const boundary = 'crash-test-boundary';
    const head = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="crash-lot.csv"\r\nContent-Type: text/csv\r\n\r\n`,
    );
    const req = http.request(`${server.base}/api/lots/${lotId}/readings`, {
      method: 'POST',
      headers: { ...headers, 'Content-Type': `multipart/form-data; boundary=${boundary}` },
    });
    req.on('error', () => undefined); // the connection dies with the server
    req.write(head);
    const csv = csvFor(lotId);
    req.write(csv.subarray(0, csv.length >> 1));
    // The moment: half the file has reached the temporary file, the rest is never sent.
    await until(
      'the temporary file',
      () => incomingFiles().some((f) => fs.statSync(path.join(incomingDir(uploadsDir), f)).size > 0),
      server,
    );
    await kill9(server);
    expect(incomingFiles().length).toBe(1); // what the crash left, for the restart to remove
    const again = await startServer();
    try {
      expect(again.output()).toMatch(/Removed 1 interrupted upload/);
      await expectWhole(again, lotId, 0);
      await expectUploadsAgain(again, lotId);
    } finally {
      await stop(again);
    }
  });

  const inServer: { point: PausePoint; moment: string; rows: number; orphan: boolean }[] = [
    { point: 'lot-upload:mid-insert', moment: 'half the rows inserted, inside the transaction', rows: 0, orphan: false },
    {
      point: 'lot-upload:file-moved',
      moment: 'every row inserted and the file moved into place, before the commit',
      rows: 0,
      orphan: true,
    },
    { point: 'lot-upload:committed', moment: 'just after the commit, before the answer', rows: ROWS, orphan: false },
  ];
  for (const c of inServer) {
    test(`${c.moment}: ${c.rows ? 'every row' : 'no rows'}, no orphan file`, async () => {
      const server = await startServer(c.point);
      const headers = await signIn(server);
      const lotId = await newLot(server, headers);
      const answered = upload(server, headers, lotId).then(
        (res) => `answered ${res.status}`,
        () => 'no answer',
      );
      await until(`pause point ${c.point}`, () => server.output().includes(`pause point reached: ${c.point}`), server);
      await kill9(server);
      expect(await answered).toBe('no answer');
      // What the crash left on disk before the restart: the moved file has no committed row yet.
      const hashes = new Set(
        readDb((db) => db.prepare('select content_hash as h from attachments').all() as { h: string }[]).map((r) => r.h),
      );
      expect(storedFiles().some((f) => !hashes.has(f))).toBe(c.orphan);
      const again = await startServer();
      try {
        if (c.orphan) expect(again.output()).toMatch(/Removed \d+ interrupted upload\(s\) and 1 unreferenced stored file/);
        await expectWhole(again, lotId, c.rows);
        if (c.rows === 0) await expectUploadsAgain(again, lotId);
      } finally {
        await stop(again);
      }
    });
  }
});
