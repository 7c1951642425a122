// Builds the client, starts the real server (tsx server/index.ts) on a free port with a fresh
// data folder and the demo seed, and hands its address to the tests.
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
    demoPassword: string;
    /** File that receives everything the server writes to stderr (watched by every test). */
    serverStderrFile: string;
  }
}

const DEMO_PASSWORD = 'e2e-demo-passphrase';

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

async function waitFor(url: string, child: ChildProcess, log: () => string): Promise<void> {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${log()}`);
    try {
      const res = await fetch(url);
      if (res.ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`server did not answer ${url}:\n${log()}`);
}

export default async function setup(project: TestProject) {
  const root = path.resolve(import.meta.dirname, '../..');
  // The production build (vitest sets NODE_ENV=test, which would give React's development build).
  execFileSync('npx', ['vite', 'build', '--logLevel', 'warn'], {
    cwd: root,
    stdio: 'inherit',
    env: { ...process.env, NODE_ENV: 'production' },
  });
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-e2e-'));
  const port = await freePort();
  let output = '';
  const child = spawn('npx', ['tsx', 'server/index.ts'], {
    cwd: root,
    env: {
      ...process.env,
      PORT: String(port),
      LUGBOOK_DATA_DIR: dataDir,
      LUGBOOK_DEMO_PASSWORD: DEMO_PASSWORD,
      NODE_ENV: 'test',
      LUGBOOK_REQUEST_LOG: 'false',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
    // Its own process group, so the teardown ends npx, tsx and the server together.
    detached: true,
  });
  const serverStderrFile = path.join(dataDir, 'server-stderr.log');
  fs.writeFileSync(serverStderrFile, '');
  child.stdout?.on('data', (d) => (output += d));
  child.stderr?.on('data', (d) => {
    output += d;
    fs.appendFileSync(serverStderrFile, d);
  });
  const baseUrl = `http://localhost:${port}`;
  await waitFor(`${baseUrl}/api/health`, child, () => output);
  project.provide('baseUrl', baseUrl);
  project.provide('demoPassword', DEMO_PASSWORD);
  project.provide('serverStderrFile', serverStderrFile);
  return () => {
    try {
      process.kill(-child.pid!, 'SIGTERM');
    } catch {
      /* already gone */
    }
    fs.rmSync(dataDir, { recursive: true, force: true });
  };
}
