// Hardening of the foundation: sign-in limits, timing of unknown e-mails, Host checking and mail
// links, invitation token routes, error statuses, password length, absolute session lifetime,
// failed sign-ins in the audit log, and the rate-limit counters shared through PostgreSQL.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { AuditEvent, MailMessage } from '../../backend/src/models';
import { startFakeSmtp, type FakeSmtp } from '../../backend/src/services/mail/fakeSmtp';
import { createMailer, type Mailer } from '../../backend/src/services/mail/mailer';
import { buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
let smtp: FakeSmtp;
let mailer: Mailer;
let clientDir: string;
let clock = new Date('2026-12-01T08:00:00Z');
const logged: string[] = [];
const DAY = 24 * 3600_000;

beforeAll(async () => {
  smtp = await startFakeSmtp();
  mailer = createMailer(smtp.url, 'Ringfence <no-reply@ringfence.local>');
  clientDir = mkdtempSync(path.join(os.tmpdir(), 'ringfence-client-'));
  mkdirSync(path.join(clientDir, 'assets'));
  writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><title>Ringfence</title>');
  writeFileSync(path.join(clientDir, 'assets', 'app.js'), 'export {};');
  t = await createTestApp({}, { mailer, now: () => clock, clientDir, log: (m) => logged.push(m) });
});
afterAll(async () => {
  mailer.close();
  await smtp.close();
  await t.close();
  rmSync(clientDir, { recursive: true, force: true });
});
afterEach(() => {
  vi.restoreAllMocks();
});

const login = (app: Parameters<typeof request>[0], email: string, password = 'not-the-password') =>
  request(app).post('/api/auth/login').send({ email, password });

describe('sign-in limits', () => {
  it('counts spaces, tabs and no-break spaces around the e-mail as the same account', async () => {
    const limited = t.appWith({ LOGIN_RATE_LIMIT: '3' });
    const email = 'spaced@example.test';
    const codes: number[] = [];
    for (const variant of [email, ` ${email}`, `\t${email}`, `\u00a0${email.toUpperCase()} `]) codes.push((await login(limited, variant)).status);
    expect(codes).toEqual([401, 401, 401, 429]);
  });

  it('limits one address trying many accounts (password spraying)', async () => {
    // Counters are shared by every app on the database: start this address from zero.
    await t.sequelize.query(`DELETE FROM rate_limit_hits WHERE key LIKE 'login-ip:%'`);
    const limited = t.appWith({ LOGIN_IP_RATE_LIMIT: '4' });
    const codes: number[] = [];
    for (let i = 0; i < 6; i++) codes.push((await login(limited, `spray${i}@example.test`)).status);
    expect(codes).toEqual([401, 401, 401, 401, 429, 429]);
  });

  it('shares the counters between servers on one database', async () => {
    const a = t.appWith({ LOGIN_RATE_LIMIT: '3' });
    const b = t.appWith({ LOGIN_RATE_LIMIT: '3' });
    const email = 'shared-counter@example.test';
    const codes = [(await login(a, email)).status, (await login(b, email)).status, (await login(a, email)).status, (await login(b, email)).status];
    expect(codes).toEqual([401, 401, 401, 429]);
    const [rows] = await t.sequelize.query(`SELECT count(*)::int AS n FROM rate_limit_hits`);
    expect((rows as Array<{ n: number }>)[0].n).toBeGreaterThan(0);
  });

  it('records failed sign-ins in the audit log without the password', async () => {
    const u = await buildUser();
    await login(t.app, u.email, 'secret-guess-one');
    await login(t.app, 'nobody-here@example.test', 'secret-guess-two');
    const known = await AuditEvent.findOne({ where: { action: 'auth.login_failed', entityId: String(u.id) } });
    expect(known).not.toBeNull();
    expect(known!.details).toMatchObject({ email: u.email });
    const unknown = await AuditEvent.findAll({ where: { action: 'auth.login_failed', entityId: null } });
    expect(unknown.map((e) => (e.details as { email: string }).email)).toContain('nobody-here@example.test');
    const all = JSON.stringify(await AuditEvent.findAll({ where: { action: 'auth.login_failed' } }));
    expect(all).not.toContain('secret-guess');
  });

  it('compares an unknown e-mail against a hash of the configured cost', async () => {
    const costly = t.appWith({ BCRYPT_COST: '6' });
    const compare = vi.spyOn(bcrypt, 'compare');
    expect((await login(costly, 'no-account-here@example.test')).status).toBe(401);
    expect(compare).toHaveBeenCalled();
    // bcrypt hashes are $2b$<cost>$…: the dummy must cost what a real account's hash costs.
    expect(String(compare.mock.calls[0][1]).slice(0, 7)).toBe('$2b$06$');
  });
});

describe('passwords', () => {
  it('refuses a password longer than 72 UTF-8 bytes with a clear message', async () => {
    const admin = await buildUser({ role: 'admin' });
    const agent = await signedIn(t.app, admin.email, TEST_PASSWORD);
    // 37 × "é" is 37 characters but 74 bytes in UTF-8; bcrypt would silently ignore the last 2.
    const res = await agent.post('/api/users').send({ email: 'long-pass@example.test', name: 'Long', role: 'planner', password: 'é'.repeat(37) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.password).toMatch(/72 bytes/);
    const ok = await agent.post('/api/users').send({ email: 'long-pass@example.test', name: 'Long', role: 'planner', password: 'é'.repeat(36) });
    expect(ok.status).toBe(201);
  });
});

describe('host checking and mail links', () => {
  it('refuses requests for a host that is not configured with 421 (DNS rebinding too)', async () => {
    const app = t.appWith({ PORT: '3000' });
    const rebound = await request(app).post('/api/auth/login').set('Host', 'evil.example').set('Origin', 'http://evil.example').send({ email: 'a@example.test', password: 'x' });
    expect(rebound.status).toBe(421);
    expect(rebound.body.error.code).toBe('misdirected');
    expect((await request(app).get('/api/health').set('Host', 'localhost:3001')).status).toBe(421);
    expect((await request(app).get('/api/health').set('Host', 'localhost:3000')).status).toBe(200);
    expect((await request(app).get('/api/health').set('Host', '127.0.0.1:3000')).status).toBe(200);
    const listed = t.appWith({ PORT: '3000', ALLOWED_HOSTS: 'cells.example.test' });
    expect((await request(listed).get('/api/health').set('Host', 'cells.example.test')).status).toBe(200);
    expect((await request(listed).get('/api/health').set('Host', 'other.example.test')).status).toBe(421);
  });

  it('builds mail links from PUBLIC_URL, never from the Host header', async () => {
    const app = t.appWith({ PORT: '3000', PUBLIC_URL: 'https://ringfence.example.test/', ALLOWED_HOSTS: 'forged.example.test' });
    const admin = await buildUser({ role: 'admin' });
    const a = request.agent(app);
    const signIn = await a.post('/api/auth/login').set('Host', 'forged.example.test').send({ email: admin.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(200);
    const res = await a.post('/api/invitations').set('Host', 'forged.example.test').send({ email: 'linked@example.test', role: 'reviewer' });
    expect(res.status).toBe(201);
    const msg = await MailMessage.findOne({ where: { subject: 'Your invitation to Ringfence' }, order: [['id', 'DESC']] });
    expect(msg!.text).toContain('https://ringfence.example.test/invite/');
    expect(msg!.text).not.toContain('forged.example.test');
  });

  it('without PUBLIC_URL, builds mail links from the listen address', async () => {
    const app = t.appWith({ PORT: '3000', ALLOWED_HOSTS: 'forged.example.test' });
    const admin = await buildUser({ role: 'admin' });
    const a = request.agent(app);
    expect((await a.post('/api/auth/login').set('Host', 'forged.example.test').send({ email: admin.email, password: TEST_PASSWORD })).status).toBe(200);
    expect((await a.post('/api/invitations').set('Host', 'forged.example.test').send({ email: 'linked2@example.test', role: 'reviewer' })).status).toBe(201);
    const msg = await MailMessage.findOne({ where: { subject: 'Your invitation to Ringfence' }, order: [['id', 'DESC']] });
    expect(msg!.text).toContain('http://127.0.0.1:3000/invite/');
    expect(msg!.text).not.toContain('forged.example.test');
  });
});

describe('invitation token routes', () => {
  it('looks the token up before hashing the password', async () => {
    const hash = vi.spyOn(bcrypt, 'hash');
    const res = await request(t.app).post('/api/invitations/token/bogus-token-bogus-token-bogus/accept').send({ name: 'Eve', password: 'long-enough-pass' });
    expect(res.status).toBe(404);
    expect(hash).not.toHaveBeenCalled();
  });

  it('limits attempts on the token routes', async () => {
    await t.sequelize.query(`DELETE FROM rate_limit_hits WHERE key LIKE 'invite:%'`);
    const limited = t.appWith({ INVITE_RATE_LIMIT: '3' });
    const codes: number[] = [];
    for (let i = 0; i < 4; i++) codes.push((await request(limited).get(`/api/invitations/token/unknown-token-number-${i}-xxxxxxxx`)).status);
    expect(codes).toEqual([404, 404, 404, 429]);
  });
});

describe('error statuses', () => {
  it('answers a missing asset with a plain 404 and logs nothing', async () => {
    logged.length = 0;
    const res = await request(t.app).get('/assets/nope.js');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/text\/plain/);
    expect((await request(t.app).get('/assets/app.js')).status).toBe(200);
    expect(logged).toEqual([]);
  });

  it('answers a traversal attempt with a 4xx and logs nothing', async () => {
    logged.length = 0;
    const res = await request(t.app).get('/assets/..%2f..%2fetc%2fpasswd');
    expect([400, 403, 404]).toContain(res.status);
    expect(res.text).not.toContain('root:');
    expect(logged).toEqual([]);
  });

  it('answers an unknown JSON charset with 415 in the JSON error shape and logs nothing', async () => {
    logged.length = 0;
    const res = await request(t.app).post('/api/auth/login').set('Content-Type', 'application/json; charset=klingon').send('{"email":"a@b.c"}');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBeTypeOf('string');
    expect(res.body.error.message).toBeTypeOf('string');
    expect(logged).toEqual([]);
  });
});

describe('session lifetime', () => {
  it('ends a session after the absolute lifetime even when it was used all along', async () => {
    const u = await buildUser();
    clock = new Date('2026-12-01T08:00:00Z');
    const agent = await signedIn(t.app, u.email, TEST_PASSWORD);
    for (let d = 1; d <= 6; d++) {
      clock = new Date(Date.parse('2026-12-01T08:00:00Z') + d * DAY);
      expect((await agent.get('/api/auth/me')).status).toBe(200);
    }
    clock = new Date(Date.parse('2026-12-01T08:00:00Z') + 7 * DAY + 60_000);
    const late = await agent.get('/api/auth/me');
    expect(late.status).toBe(401);
    clock = new Date('2026-12-01T08:00:00Z');
  });

  it('takes the absolute lifetime from the configuration', async () => {
    const short = t.appWith({ SESSION_LIFETIME_HOURS: '2' });
    const u = await buildUser();
    clock = new Date('2026-12-01T08:00:00Z');
    const agent = await signedIn(short, u.email, TEST_PASSWORD);
    clock = new Date('2026-12-01T09:30:00Z');
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    clock = new Date('2026-12-01T10:01:00Z');
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    clock = new Date('2026-12-01T08:00:00Z');
  });
});
