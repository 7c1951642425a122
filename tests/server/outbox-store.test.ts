// A built message is written to the outbox in one transaction: on the request thread when it is small, by
// a pool worker when it is large (a customer report with its sound clips), and on the request thread after
// all when the pool cannot take it, rather than not at all (server/mail/mailer.ts, outbox-store.ts).
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { HttpError } from '@server/http/errors';
import { createMailer } from '@server/mail/mailer';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const rows = (subject: string) =>
  t.ctx.sqlite
    .prepare(
      'select o.id, o.raw, (select count(*) from outbox_attachments a where a.message_id = o.id) as files from outbox o where subject = ?',
    )
    .all(subject) as { id: number; raw: string; files: number }[];

/** A mailer over the test app's database whose pool is `run` (the real one, or one that refuses). */
function mailer(run: typeof t.ctx.pool.run) {
  const asked: string[] = [];
  const pool = {
    ...t.ctx.pool,
    run: ((name, input, opts) => {
      asked.push(name);
      return run(name, input, opts);
    }) as typeof t.ctx.pool.run,
  };
  return { asked, send: createMailer(t.ctx.db, { from: 'Lugbook <no-reply@lugbook.test>', pool, dbFile: t.ctx.sqlite.name }).send };
}

const clip = Buffer.alloc(600 * 1024, 7);
/** A customer report with a 600 kB clip: over the 256 kB a message may have to be written here. */
const largeMessage = (subject: string) => ({
  to: 'a@lugbook.test',
  topic: 'customer-report' as const,
  subject,
  text: 'With a clip.',
  attachments: [{ filename: 'clip.wav', content: clip, contentType: 'audio/wav' }],
});

describe('outbox writes', () => {
  test('a small message is written here; a large one by a worker, with its files', async () => {
    const m = mailer(t.ctx.pool.run.bind(t.ctx.pool));
    await m.send({ to: 'a@lugbook.test', topic: 'invitation', subject: 'small one', text: 'Hello.' });
    expect(m.asked).toEqual([]);
    expect(rows('small one')).toHaveLength(1);
    await m.send(largeMessage('large one'));
    expect(m.asked).toEqual(['outboxStore']);
    const [large] = rows('large one');
    expect(large!.files).toBe(1);
    expect(large!.raw).toMatch(/filename=clip\.wav/);
    const stored = t.ctx.sqlite.prepare('select content from outbox_attachments where message_id = ?').get(large!.id) as {
      content: Buffer;
    };
    expect(stored.content.equals(clip)).toBe(true);
  });

  test('a large message the pool cannot take is written here, once', async () => {
    const m = mailer((() => Promise.reject(new HttpError(503, 'busy', 'The server is busy.'))) as unknown as typeof t.ctx.pool.run);
    await m.send(largeMessage('large, pool busy'));
    expect(m.asked).toEqual(['outboxStore']);
    expect(rows('large, pool busy')).toHaveLength(1);
    expect(rows('large, pool busy')[0]!.files).toBe(1);
  });

  test('any other failure of the worker is not hidden', async () => {
    const m = mailer((() => Promise.reject(new Error('disk full'))) as unknown as typeof t.ctx.pool.run);
    await expect(
      m.send({
        to: 'a@lugbook.test',
        topic: 'customer-report',
        subject: 'large, failed',
        text: 'x',
        attachments: [{ filename: 'c.wav', content: clip }],
      }),
    ).rejects.toThrow('disk full');
    expect(rows('large, failed')).toHaveLength(0);
  });
});
