// Invitations: the one-time link mailed over SMTP works once, expires after 72 h (the app's clock is moved, not slept).
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { AuditEvent, Invitation, MailMessage, ProjectMember, User } from '../../backend/src/models';
import { startFakeSmtp, type FakeSmtp } from '../../backend/src/services/mail/fakeSmtp';
import { createMailer, type Mailer } from '../../backend/src/services/mail/mailer';
import { buildProject, buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
let smtp: FakeSmtp;
let mailer: Mailer;
let clock = new Date('2026-12-01T08:00:00Z');
const HOUR = 3600_000;

beforeAll(async () => {
  smtp = await startFakeSmtp();
  mailer = createMailer(smtp.url, 'Ringfence <no-reply@ringfence.local>');
  t = await createTestApp({ PUBLIC_URL: 'https://ringfence.example.test' }, { mailer, now: () => clock });
});
afterAll(async () => {
  mailer.close();
  await smtp.close();
  await t.close();
});

async function inviteAndReadLink(admin: ReturnType<typeof request.agent>, body: object): Promise<{ token: string; id: number }> {
  const res = await admin.post('/api/invitations').send(body);
  expect(res.status).toBe(201);
  expect(res.body.mail.status).toBe('sent');
  const email = (body as { email: string }).email.toLowerCase();
  const msg = await MailMessage.findOne({ where: { subject: 'Your invitation to Ringfence' }, order: [['id', 'DESC']] });
  expect(msg!.to).toEqual([email]);
  const m = /https:\/\/ringfence\.example\.test\/invite\/([A-Za-z0-9_-]+)/.exec(msg!.text);
  expect(m).not.toBeNull();
  return { token: m![1], id: res.body.invitation.id };
}

describe('invitations', () => {
  it('a client invitation: link works once, creates the account signed in, with membership; used link refused', async () => {
    const admin = await buildUser({ role: 'admin' });
    const project = await buildProject();
    const A = await signedIn(t.app, admin.email, TEST_PASSWORD);
    expect((await A.post('/api/invitations').send({ email: 'new.client@example.test', role: 'client' })).status).toBe(400);
    const { token, id } = await inviteAndReadLink(A, { email: 'New.Client@example.test', role: 'client', projectId: project.id });
    // Only the sha256 of the 32-byte token is stored.
    expect(Buffer.from(token, 'base64url')).toHaveLength(32);
    const row = await Invitation.findByPk(id);
    expect(row!.tokenHash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(row!.toJSON())).not.toContain(token);
    expect(row!.expiresAt.getTime() - clock.getTime()).toBe(72 * HOUR);
    expect((await A.get('/api/invitations')).body.invitations.map((i: { id: number }) => i.id)).toContain(id);

    const page = await request(t.app).get(`/api/invitations/token/${token}`);
    expect(page.body.invitation).toMatchObject({ email: 'new.client@example.test', role: 'client' });
    const guest = request.agent(t.app);
    expect((await guest.post(`/api/invitations/token/${token}/accept`).send({ name: 'Nell Client', password: 'short' })).status).toBe(400);
    const ok = await guest.post(`/api/invitations/token/${token}/accept`).send({ name: 'Nell Client', password: 'biscuits-and-tea' });
    expect(ok.status).toBe(201);
    expect((await guest.get('/api/auth/me')).body.user).toMatchObject({ email: 'new.client@example.test', role: 'client', name: 'Nell Client' });
    const user = await User.findOne({ where: { email: 'new.client@example.test' } });
    expect(await ProjectMember.count({ where: { projectId: project.id, userId: user!.id } })).toBe(1);
    await signedIn(t.app, 'new.client@example.test', 'biscuits-and-tea');

    const again = await request(t.app).post(`/api/invitations/token/${token}/accept`).send({ name: 'Someone', password: 'another-password' });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('invitation_used');
    expect((await request(t.app).get(`/api/invitations/token/${token}`)).status).toBe(410);
    expect((await A.get('/api/invitations')).body.invitations.map((i: { id: number }) => i.id)).not.toContain(id);
    expect(await AuditEvent.count({ where: { action: ['invitation.create', 'invitation.accept'] } })).toBeGreaterThanOrEqual(2);
  });

  it('expires after 72 hours; a revoked link is refused; an existing account cannot be invited', async () => {
    const admin = await buildUser({ role: 'admin' });
    const A = await signedIn(t.app, admin.email, TEST_PASSWORD);
    const late = await inviteAndReadLink(A, { email: 'late.reviewer@example.test', role: 'reviewer' });
    clock = new Date(clock.getTime() + 72 * HOUR - 1000);
    expect((await request(t.app).get(`/api/invitations/token/${late.token}`)).status).toBe(200);
    clock = new Date(clock.getTime() + 1000);
    const gone = await request(t.app).post(`/api/invitations/token/${late.token}/accept`).send({ name: 'Late', password: 'too-late-password' });
    expect(gone.status).toBe(410);
    expect(gone.body.error.code).toBe('invitation_expired');
    expect(await User.count({ where: { email: 'late.reviewer@example.test' } })).toBe(0);

    const revoked = await inviteAndReadLink(A, { email: 'withdrawn@example.test', role: 'planner' });
    expect((await A.delete(`/api/invitations/${revoked.id}`)).status).toBe(204);
    expect((await request(t.app).post(`/api/invitations/token/${revoked.token}/accept`).send({ name: 'W', password: 'withdrawn-pass' })).body.error.code).toBe('invitation_revoked');
    expect((await request(t.app).get('/api/invitations/token/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA')).status).toBe(404);

    const existing = await buildUser({ role: 'planner' });
    expect((await A.post('/api/invitations').send({ email: existing.email, role: 'planner' })).status).toBe(409);
  });
});
