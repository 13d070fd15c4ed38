import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessage } from '../../backend/src/models';
import { startFakeSmtp, type FakeSmtp } from '../../backend/src/services/mail/fakeSmtp';
import { createMailer } from '../../backend/src/services/mail/mailer';
import { createTestApp, type TestApp } from '../support/testApp';

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

describe('local mail fake', () => {
  it('captures a message sent over a real SMTP conversation, attachment bytes intact', async () => {
    const mailer = createMailer(smtp.url, 'Ringfence <no-reply@ringfence.local>');
    const pdf = Buffer.from('%PDF-1.4\n% test attachment\n');
    await mailer.send({ to: ['client@fernhill.test'], subject: 'Plan sheet, revision A', text: 'Attached.', attachments: [{ filename: 'sheet.pdf', content: pdf, contentType: 'application/pdf' }] });
    mailer.close();
    const msg = await MailMessage.findOne({ where: { subject: 'Plan sheet, revision A' } });
    expect(msg).not.toBeNull();
    expect(msg!.to).toEqual(['client@fernhill.test']);
    expect(msg!.text.trim()).toBe('Attached.');
    expect(msg!.attachments).toEqual([
      { filename: 'sheet.pdf', contentType: 'application/pdf', size: pdf.length, checksum: createHash('sha256').update(pdf).digest('hex') },
    ]);
    expect(msg!.raw.toString('utf8')).toMatch(/^Content-Type: multipart\/mixed/m);
  });
});
