import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, User } from '../../backend/src/models';
import { buildUser, TEST_PASSWORD } from '../support/factories';
import { createTestApp, signedIn, type TestApp } from '../support/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

describe('sign-in', () => {
  it('signs in with the right password, sets an httpOnly SameSite=Lax cookie, and /me answers', async () => {
    const u = await buildUser({ role: 'reviewer' });
    const agent = request.agent(t.app);
    const res = await agent.post('/api/auth/login').send({ email: u.email.toUpperCase(), password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({ id: u.id, email: u.email, name: u.name, role: 'reviewer' });
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/rf\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(res.body.user.passwordHash).toBeUndefined();
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(u.email);
    // the session lives in PostgreSQL
    const [rows] = await t.sequelize.query(`SELECT count(*)::int AS n FROM "session"`);
    expect((rows as Array<{ n: number }>)[0].n).toBeGreaterThan(0);
    expect(await AuditEvent.count({ where: { action: 'auth.login', actorId: u.id } })).toBe(1);
  });

  it('refuses a wrong password and an unknown e-mail with the same 401', async () => {
    const u = await buildUser();
    const a = await request(t.app).post('/api/auth/login').send({ email: u.email, password: 'wrong-password-x' });
    const b = await request(t.app).post('/api/auth/login').send({ email: 'nobody@example.test', password: 'wrong-password-x' });
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    expect(a.body.error.code).toBe('bad_credentials');
    expect(b.body.error.message).toBe(a.body.error.message);
  });

  it('answers malformed sign-in input with 400 and field messages, bad JSON with 400', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('email');
    expect(res.body.error.fields).toHaveProperty('password');
    const bad = await request(t.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('bad_json');
  });

  it('regenerates the session id at sign-in (no fixation) and destroys it at sign-out', async () => {
    const u = await buildUser();
    const agent = request.agent(t.app);
    const first = await agent.post('/api/auth/login').send({ email: u.email, password: TEST_PASSWORD });
    const sid1 = /rf\.sid=([^;]+)/.exec(String(first.headers['set-cookie']))![1];
    const second = await agent.post('/api/auth/login').send({ email: u.email, password: TEST_PASSWORD });
    const sid2 = /rf\.sid=([^;]+)/.exec(String(second.headers['set-cookie']))![1];
    expect(sid2).not.toBe(sid1);
    expect((await agent.post('/api/auth/logout')).status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    // the old cookie no longer works either
    const replay = await request(t.app).get('/api/auth/me').set('Cookie', `rf.sid=${sid2}`);
    expect(replay.status).toBe(401);
  });

  it('refuses a deactivated user and ends their open sessions', async () => {
    const adminUser = await buildUser({ role: 'admin' });
    const victim = await buildUser({ role: 'planner' });
    const victimAgent = await signedIn(t.app, victim.email, TEST_PASSWORD);
    expect((await victimAgent.get('/api/projects')).status).toBe(200);
    const adminAgent = await signedIn(t.app, adminUser.email, TEST_PASSWORD);
    const res = await adminAgent.patch(`/api/users/${victim.id}`).send({ active: false });
    expect(res.status).toBe(200);
    expect(res.body.user.active).toBe(false);
    expect((await victimAgent.get('/api/projects')).status).toBe(401);
    const again = await request(t.app).post('/api/auth/login').send({ email: victim.email, password: TEST_PASSWORD });
    expect(again.status).toBe(401);
    expect((await User.findByPk(victim.id))!.active).toBe(false);
  });

  it('refuses cross-site state-changing requests by Origin, accepts same-origin ones', async () => {
    const u = await buildUser();
    const cross = await request(t.app).post('/api/auth/login').set('Origin', 'https://evil.example').send({ email: u.email, password: TEST_PASSWORD });
    expect(cross.status).toBe(403);
    const same = await request(t.app)
      .post('/api/auth/login')
      .set('Host', '127.0.0.1:3000')
      .set('Origin', 'http://127.0.0.1:3000')
      .send({ email: u.email, password: TEST_PASSWORD });
    expect(same.status).toBe(200);
  });

  it('answers health with the database state and unknown API routes with a JSON 404', async () => {
    expect((await request(t.app).get('/api/health')).body).toEqual({ ok: true, db: 'up' });
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('no_route');
  });

  it('sets security headers', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 after too many attempts for one e-mail', async () => {
    const limited = t.appWith({ LOGIN_RATE_LIMIT: '3' });
    const codes: number[] = [];
    for (let i = 0; i < 5; i++) {
      codes.push((await request(limited).post('/api/auth/login').send({ email: 'x@example.test', password: 'nope-nope-nope' })).status);
    }
    expect(codes).toEqual([401, 401, 401, 429, 429]);
    expect((await request(limited).post('/api/auth/login').send({ email: 'y@example.test', password: 'nope-nope-nope' })).status).toBe(401);
  });
});
