import { fileURLToPath } from 'node:url';
import { createApp } from '@server/app';
import { createContext } from '@server/bootstrap';
import { seedDemo } from '@server/demo/seed';
import { refitOutdatedTaperFits } from '@server/features/sweeps/refit-on-start';
import { readEnv, startupWarnings } from '@server/env';
import { sweepUploads } from '@server/uploads/sweep';
import { poolOptionsFromEnv } from '@server/pool';
import { computeMissingLotStats } from '@server/features/lots/stats-jobs';

const env = readEnv();
for (const warning of startupWarnings()) console.warn(`Warning: ${warning}`);
const ctx = createContext({
  dbFile: env.dbFile,
  uploadsDir: env.uploadsDir,
  production: env.NODE_ENV === 'production',
  publicUrl: env.PUBLIC_URL,
  smtpUrl: env.SMTP_URL,
  mailFrom: env.MAIL_FROM,
  allowedHosts: env.LUGBOOK_ALLOWED_HOSTS,
  ...(env.LUGBOOK_REQUEST_LOG ? { requestLog: process.stdout } : {}),
  clientDir: env.LUGBOOK_CLIENT_DIR ?? fileURLToPath(new URL('../dist/client', import.meta.url)),
  // Workers started now, so the first heavy request does not wait for one to load.
  pool: { ...poolOptionsFromEnv(), warm: true },
});

if (env.LUGBOOK_SEED_DEMO) {
  const seeded = await seedDemo(ctx, { password: env.LUGBOOK_DEMO_PASSWORD });
  if (seeded) console.log(`Seeded the demo workshop into ${env.dbFile}`);
}

const refit = refitOutdatedTaperFits(ctx.db);
if (refit.refitted > 0) console.log(`Refitted ${refit.refitted} stored taper fit(s) made by an older engine version.`);
for (const f of refit.failed) console.log(`Sweep ${f.sweepId} kept its old fit: ${f.reason}`);
const swept = sweepUploads(ctx.sqlite, env.uploadsDir);
if (swept.incoming + swept.orphans > 0)
  console.log(`Removed ${swept.incoming} interrupted upload(s) and ${swept.orphans} unreferenced stored file(s).`);

// Lots whose statistics are not stored yet (the seeded demo lot, an older engine version): computed in
// the pool in the background, so that no reader waits for them.
void computeMissingLotStats(ctx).then(
  (n) => n > 0 && console.log(`Computed the stored statistics of ${n} lot(s).`),
  (err: unknown) => console.log(`Lot statistics are left to each lot's next read: ${err instanceof Error ? err.message : String(err)}`),
);

const server = createApp(ctx).listen(env.PORT, () => {
  console.log(`Lugbook is serving on http://localhost:${env.PORT} (data in ${env.LUGBOOK_DATA_DIR})`);
  if (!env.SMTP_URL) console.log('No SMTP_URL: e-mail goes to the Outbox screen (admins).');
});

function shutdown(signal: string) {
  console.log(`${signal}: closing`);
  server.close(() => {
    void ctx.pool.close().finally(() => {
      ctx.sqlite.close();
      process.exit(0);
    });
  });
  setTimeout(() => process.exit(1), 5000).unref();
}
process.on('SIGINT', () => shutdown('SIGINT'));
process.on('SIGTERM', () => shutdown('SIGTERM'));
