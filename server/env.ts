import path from 'node:path';
import { z } from 'zod';

const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  /** Holds the SQLite file and the uploads folder. */
  LUGBOOK_DATA_DIR: z.string().min(1).default('data'),
  /** Password of the demo accounts; the README prints the default. */
  LUGBOOK_DEMO_PASSWORD: z.string().min(8).default('bench-demo-2026'),
  /** Seed the invented demo scenario into an empty database. */
  LUGBOOK_SEED_DEMO: z
    .enum(['true', 'false'])
    .default('true')
    .transform((v) => v === 'true'),
  /** With no SMTP_URL, every message goes to the local outbox table (Outbox screen). */
  SMTP_URL: z.string().url().optional(),
  MAIL_FROM: z.string().default('Lugbook <no-reply@lugbook.test>'),
  /** The built client to serve; default dist/client of the checkout. */
  LUGBOOK_CLIENT_DIR: z.string().min(1).optional(),
  /** The address links in e-mails point to. */
  PUBLIC_URL: z.string().url().default('http://localhost:3000'),
  /** More host names to answer to, comma-separated (e.g. the shop computer's name or LAN address for phones). */
  LUGBOOK_ALLOWED_HOSTS: z
    .string()
    .default('')
    .transform((v) =>
      v
        .split(',')
        .map((h) => h.trim())
        .filter(Boolean),
    ),
  /** Structured request logs on standard output: on unless "false". */
  LUGBOOK_REQUEST_LOG: z
    .enum(['true', 'false'])
    .default('true')
    .transform((v) => v === 'true'),
});

const DEFAULT_PUBLIC_URL = 'http://localhost:3000';

/** What the server should warn about at start: a production server whose e-mail links would point to localhost. */
export function startupWarnings(source: NodeJS.ProcessEnv = process.env): string[] {
  const env = EnvSchema.safeParse(source);
  if (!env.success) return [];
  const warnings: string[] = [];
  if (env.data.NODE_ENV === 'production' && (!source.PUBLIC_URL || env.data.PUBLIC_URL === DEFAULT_PUBLIC_URL)) {
    warnings.push(
      `NODE_ENV=production with the default PUBLIC_URL (${DEFAULT_PUBLIC_URL}): links in e-mails will point to localhost. Set PUBLIC_URL to the address people open.`,
    );
  }
  return warnings;
}

export type Env = z.infer<typeof EnvSchema> & { dbFile: string; uploadsDir: string };

export function readEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = EnvSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Lugbook cannot start, the environment is not valid:\n${lines.join('\n')}`);
  }
  const dataDir = path.resolve(parsed.data.LUGBOOK_DATA_DIR);
  return {
    ...parsed.data,
    LUGBOOK_DATA_DIR: dataDir,
    dbFile: path.join(dataDir, 'lugbook.db'),
    uploadsDir: path.join(dataDir, 'uploads'),
  };
}
