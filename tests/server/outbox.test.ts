// The Outbox lists each message's attachments (name, type, size) and serves each one back as a
// download, to admins only.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Listed = {
  id: number;
  subject: string;
  attachments: { id: number; filename: string; contentType: string; size: number }[];
  attachmentsInSourceOnly: boolean;
};

/** Reads a response body as bytes whatever its type. */
const asBuffer = (res: import('superagent').Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('outbox attachments', () => {
  test('a message lists its attachments by name and size, and each downloads as an attachment, for admins only', async () => {
    const bytes = Buffer.from([0x52, 0x49, 0x46, 0x46, 0x00, 0xff, 0x10, 0x80, 0x00, 0x01]);
    const csv = '# design: test\nfrequency_hz,volume_10_db\n100,0.000\n';
    // A name with characters that need RFC 5987 encoding and a quote that must not break the header.
    await t.ctx.mailer.send({
      to: 'someone@lugbook.test',
      subject: 'Two attachments',
      text: 'See attached.',
      topic: 'customer-report',
      attachments: [
        { filename: 'curves "Ω".csv', content: csv, contentType: 'text/csv' },
        { filename: 'clip.wav', content: bytes, contentType: 'audio/wav' },
        { filename: 'page.html', content: '<script>alert(1)</script>', contentType: 'text/html' },
      ],
    });
    const admin = await t.as('admin');
    const list = (await admin.get('/api/outbox').expect(200)).body.messages as Listed[];
    const m = list.find((x) => x.subject === 'Two attachments')!;
    expect(m).not.toHaveProperty('raw');
    expect(m.attachmentsInSourceOnly).toBe(false);
    expect(m.attachments.map(({ id: _, ...a }) => a)).toEqual([
      { filename: 'curves "Ω".csv', contentType: 'text/csv', size: Buffer.byteLength(csv) },
      { filename: 'clip.wav', contentType: 'audio/wav', size: bytes.length },
      { filename: 'page.html', contentType: 'text/html', size: 25 },
    ]);
    const [csvA, wavA, htmlA] = m.attachments as [Listed['attachments'][0], Listed['attachments'][0], Listed['attachments'][0]];

    const got = await admin.get(`/api/outbox/${m.id}/attachments/${csvA.id}`).expect(200);
    expect(got.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(got.headers['content-disposition']).toMatch(/^attachment; filename=.*; filename\*=UTF-8''curves%20%22%CE%A9%22\.csv$/);
    expect(got.headers['x-content-type-options']).toBe('nosniff');
    expect(got.text).toBe(csv);

    const wav = await admin.get(`/api/outbox/${m.id}/attachments/${wavA.id}`).buffer(true).parse(asBuffer).expect(200);
    expect(wav.headers['content-type']).toBe('audio/wav');
    expect(Buffer.compare(wav.body as Buffer, bytes)).toBe(0);

    // A type the Outbox does not know goes out as bytes, as a download, never as a page.
    const html = await admin.get(`/api/outbox/${m.id}/attachments/${htmlA.id}`).expect(200);
    expect(html.headers['content-type']).toBe('application/octet-stream');
    expect(html.headers['content-disposition']).toMatch(/^attachment;/);
    expect(html.headers['content-security-policy']).toMatch(/sandbox/);

    // Another message's attachment id under this message: not found.
    expect((await admin.get(`/api/outbox/${m.id + 1000}/attachments/${csvA.id}`)).status).toBe(404);
    for (const role of ['tech', 'qa', 'viewer'] as const)
      expect((await (await t.as(role)).get(`/api/outbox/${m.id}/attachments/${csvA.id}`)).status).toBe(403);
  });

  test('a message written before attachments were kept apart says its attachments are only in its source', async () => {
    t.ctx.sqlite
      .prepare(
        "insert into outbox (\"to\", subject, text, topic, raw, transport) values ('old@lugbook.test', 'Older report', 'x', 'customer-report', ?, 'outbox')",
      )
      .run(
        'Content-Type: multipart/mixed\n\n--b\nContent-Type: text/csv; name=a.csv\nContent-Disposition: attachment; filename=a.csv\n\nx\n--b--\n',
      );
    t.ctx.sqlite
      .prepare(
        "insert into outbox (\"to\", subject, text, topic, raw, transport) values ('old@lugbook.test', 'Older note', 'x', 'invitation', 'Content-Type: text/plain\n\nx', 'outbox')",
      )
      .run();
    const list = (await (await t.as('admin')).get('/api/outbox').expect(200)).body.messages as Listed[];
    const report = list.find((x) => x.subject === 'Older report')!;
    expect(report.attachments).toEqual([]);
    expect(report.attachmentsInSourceOnly).toBe(true);
    expect(list.find((x) => x.subject === 'Older note')!.attachmentsInSourceOnly).toBe(false);
  });
});
