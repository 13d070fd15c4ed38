// The admin mail outbox: messages captured by the local SMTP fake, listed, read, attachments downloaded (parsed from raw).
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startFakeSmtp, type FakeSmtp } from '../../backend/src/services/mail/fakeSmtp';
import { createMailer } from '../../backend/src/services/mail/mailer';
import { buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
let smtp: FakeSmtp;
beforeAll(async () => {
  t = await createTestApp();
  smtp = await startFakeSmtp();
});
afterAll(async () => {
  await smtp.close();
  await t.close();
});

describe('mail outbox', () => {
  it('lists captured mail with attachment sizes, shows one message, and returns the attachment bytes intact', async () => {
    const mailer = createMailer(smtp.url, 'Ringfence <no-reply@ringfence.local>');
    // Bytes 0–255 repeated: any re-encoding slip (base64, line endings, charset) changes the checksum.
    const bytes = Buffer.from(Array.from({ length: 4096 }, (_, i) => i % 256));
    await mailer.send({
      to: ['client@fernhill.test', 'buyer@fernhill.test'],
      subject: 'Outbox test: plan sheet',
      text: 'Two attachments follow.',
      attachments: [
        { filename: 'notes.txt', content: Buffer.from('line one\r\nline two\r\n'), contentType: 'text/plain' },
        { filename: 'sheet.pdf', content: bytes, contentType: 'application/pdf' },
      ],
    });
    mailer.close();
    const admin = await buildUser({ role: 'admin' });
    const A = await signedIn(t.app, admin.email, TEST_PASSWORD);
    const list = await A.get('/api/admin/mail');
    expect(list.status).toBe(200);
    const item = list.body.messages.find((m: { subject: string }) => m.subject === 'Outbox test: plan sheet');
    expect(item.to).toEqual(['client@fernhill.test', 'buyer@fernhill.test']);
    expect(item.attachments).toEqual([
      { filename: 'notes.txt', contentType: 'text/plain', size: 20 },
      { filename: 'sheet.pdf', contentType: 'application/pdf', size: 4096 },
    ]);
    expect(Number.isNaN(Date.parse(item.at))).toBe(false);

    const one = await A.get(`/api/admin/mail/${item.id}`);
    expect(one.body.message.text.trim()).toBe('Two attachments follow.');
    expect(one.body.message).not.toHaveProperty('raw');

    const att = await A.get(`/api/admin/mail/${item.id}/attachments/1`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(att.status).toBe(200);
    expect(att.headers['content-type']).toBe('application/pdf');
    expect(att.headers['content-disposition']).toBe('attachment; filename="sheet.pdf"');
    expect(createHash('sha256').update(att.body as Buffer).digest('hex')).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect((await A.get(`/api/admin/mail/${item.id}/attachments/2`)).status).toBe(404);

    const planner = await buildUser({ role: 'planner' });
    const P = await signedIn(t.app, planner.email, TEST_PASSWORD);
    expect((await P.get('/api/admin/mail')).status).toBe(403);
    expect((await P.get(`/api/admin/mail/${item.id}/attachments/1`)).status).toBe(403);
  });

  it('the audit log filters by action family, actor, entity and time, newest first, paginated', async () => {
    const admin = await buildUser({ role: 'admin' });
    const A = await signedIn(t.app, admin.email, TEST_PASSWORD);
    const { audit } = await import('../../backend/src/services/audit/audit');
    for (let i = 0; i < 3; i++) await audit(admin.id, 'revision.submit', 'revision', 900 + i, { n: i });
    await audit(admin.id, 'comment.create', 'comment', 77);
    const page1 = await A.get(`/api/admin/audit?action=revision.&actor=${admin.id}&pageSize=2`);
    expect(page1.body.total).toBe(3);
    expect(page1.body.events.map((e: { entityId: string }) => e.entityId)).toEqual(['902', '901']);
    expect(page1.body.events[0].actor).toMatchObject({ id: admin.id, name: admin.name });
    const page2 = await A.get(`/api/admin/audit?action=revision.&actor=${admin.id}&pageSize=2&page=2`);
    expect(page2.body.events.map((e: { entityId: string }) => e.entityId)).toEqual(['900']);
    expect((await A.get(`/api/admin/audit?entity=comment&actor=${admin.id}`)).body.total).toBe(1);
    expect((await A.get(`/api/admin/audit?actor=${admin.id}&to=2000-01-01`)).body.total).toBe(0);
    expect((await A.get('/api/admin/audit?from=not-a-date')).status).toBe(400);
  });
});
