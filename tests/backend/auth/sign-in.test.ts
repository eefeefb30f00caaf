import { createHmac } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessionCookie, sessionId, startSignIn } from '../../helpers/sign-in';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
beforeAll(async () => {
  coppice = await startTestCoppice();
});
afterAll(async () => {
  await coppice?.stop();
});

describe('single sign-on through the local identity provider', () => {
  it.each([
    [ACCOUNTS.analyst, ['analyst']],
    [ACCOUNTS.privacy, ['privacy_officer']],
    [ACCOUNTS.managerNorth, ['manager']],
    [ACCOUNTS.managerSouth, ['manager']],
    [ACCOUNTS.lead, ['analyst', 'privacy_officer']],
  ])('signs %s in and GET /api/me returns the roles %j', async (email, roles) => {
    const agent = await coppice.signIn(email);
    const me = await agent.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.email).toBe(email);
    expect(me.body.roles.sort()).toEqual([...roles].sort());
    expect(me.body.name).toEqual(expect.any(String));
  });

  it('sends the browser back to the page it asked for', async () => {
    const steps = await startSignIn(coppice, ACCOUNTS.analyst, 'quillfern-demo');
    const callback = await steps.agent.get(steps.callbackUrl!.pathname + steps.callbackUrl!.search);
    expect(callback.status).toBe(302);
    expect(callback.headers.location).toBe('/datasets');
  });

  it('refuses a wrong password with a clear message on the same page', async () => {
    const steps = await startSignIn(coppice, ACCOUNTS.analyst, 'not-the-password');
    expect(steps.callbackUrl).toBeNull();
    expect(steps.loginResponse.status).toBe(401);
    const html = await steps.loginResponse.text();
    expect(html).toContain('do not match');
    expect(html).toContain('name="username"');
    expect((await steps.agent.get('/api/me')).status).toBe(401);
  });

  it('refuses a callback whose state was tampered with', async () => {
    const steps = await startSignIn(coppice, ACCOUNTS.analyst, 'quillfern-demo');
    const url = steps.callbackUrl!;
    url.searchParams.set('state', 'forged-state-value');
    const callback = await steps.agent.get(url.pathname + url.search);
    expect(callback.status).toBe(400);
    expect(callback.text).toContain('could not be verified');
    expect((await steps.agent.get('/api/me')).status).toBe(401);
  });

  it('issues a new session id at sign-in, so a session planted earlier is worthless', async () => {
    const steps = await startSignIn(coppice, ACCOUNTS.analyst, 'quillfern-demo');
    const before = sessionId(steps.agent);
    await steps.agent.get(steps.callbackUrl!.pathname + steps.callbackUrl!.search);
    const after = sessionId(steps.agent);
    expect(after).toBeTruthy();
    expect(after).not.toBe(before);
    if (before) {
      const planted = await request(coppice.app).get('/api/me').set('cookie', `coppice.sid=${before}`);
      expect(planted.status).toBe(401);
    }
  });

  it('ends the session on sign-out, also for a copy of the old cookie', async () => {
    const agent = await coppice.signIn(ACCOUNTS.privacy);
    const cookie = sessionCookie(agent);
    const out = await agent.post('/auth/logout').set('accept', 'application/json');
    expect(out.status).toBe(200);
    expect(out.body.redirectTo).toContain('/oidc/session/end');
    expect((await agent.get('/api/me')).status).toBe(401);
    const replay = await request(coppice.app).get('/api/me').set('cookie', cookie);
    expect(replay.status).toBe(401);
  });

  it('reads each session on its own when many requests arrive at once (session reads are batched)', async () => {
    const people = [ACCOUNTS.analyst, ACCOUNTS.managerNorth, ACCOUNTS.managerSouth];
    const agents = await Promise.all(people.map((email) => coppice.signIn(email)));
    const leaving = await coppice.signIn(ACCOUNTS.privacy);
    const leavingCookie = sessionCookie(leaving);
    expect((await leaving.post('/auth/logout').set('accept', 'application/json')).status).toBe(200);
    const calls = Array.from({ length: 15 }, () => [
      ...agents.map((agent) => agent.get('/api/me')),
      request(coppice.app).get('/api/me').set('cookie', leavingCookie),
      request(coppice.app).get('/api/me'),
    ]).flat();
    const answers = await Promise.all(calls);
    for (let i = 0; i < answers.length; i += people.length + 2) {
      people.forEach((email, j) => {
        expect(answers[i + j]!.status).toBe(200);
        expect(answers[i + j]!.body.email).toBe(email);
      });
      expect(answers[i + people.length]!.status).toBe(401);
      expect(answers[i + people.length + 1]!.status).toBe(401);
    }
  });

  it('ends an unreadable stored session on its own, without failing the requests read with it', async () => {
    const sid = `broken-${Date.now()}`;
    // A JSON string where a session object belongs.
    await coppice.sql(
      `INSERT INTO session (sid, sess, expire) VALUES ($1, '"not a session"'::json, now() + interval '1 hour')`,
      [sid],
    );
    const signature = createHmac('sha256', coppice.config.sessionSecret).update(sid).digest('base64');
    const broken = `coppice.sid=${encodeURIComponent(`s:${sid}.${signature.replace(/=+$/, '')}`)}`;
    const agent = await coppice.signIn(ACCOUNTS.analyst);
    const answers = await Promise.all(
      Array.from({ length: 10 }, (_, i) =>
        i % 2 ? agent.get('/api/me') : request(coppice.app).get('/api/me').set('cookie', broken),
      ),
    );
    expect(answers.map((res) => res.status)).toEqual(answers.map((_res, i) => (i % 2 ? 200 : 401)));
    for (let i = 0; i < 50; i++) {
      const left = await coppice.sql('SELECT 1 FROM session WHERE sid = $1', [sid]);
      if (left.length === 0) break;
      await new Promise((r) => setTimeout(r, 20));
    }
    expect(await coppice.sql('SELECT 1 FROM session WHERE sid = $1', [sid])).toEqual([]);
  });

  it('records sign-ins in the audit trail without personal data beyond the actor', async () => {
    await coppice.signIn(ACCOUNTS.managerSouth);
    const rows = await coppice.sql<{ action: string; actor_email: string }>(
      "SELECT action, actor_email FROM audit_events WHERE action = 'auth.sign_in' AND actor_email = $1",
      [ACCOUNTS.managerSouth],
    );
    expect(rows.length).toBeGreaterThanOrEqual(1);
  });
});

describe('the session cookie and security headers', () => {
  it('sets an httpOnly, SameSite=Lax session cookie', async () => {
    const steps = await startSignIn(coppice, ACCOUNTS.analyst, 'quillfern-demo');
    const callback = await steps.agent.get(steps.callbackUrl!.pathname + steps.callbackUrl!.search);
    const setCookie = String(callback.headers['set-cookie']);
    expect(setCookie).toMatch(/coppice\.sid=/);
    expect(setCookie).toMatch(/HttpOnly/i);
    expect(setCookie).toMatch(/SameSite=Lax/i);
  });

  it('answers 401 JSON on /api/* when signed out', async () => {
    const res = await request(coppice.app).get('/api/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('not_signed_in');
  });

  it('sends a content security policy and no x-powered-by', async () => {
    const res = await request(coppice.app).get('/api/health');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });

  it('refuses a state-changing request from another site', async () => {
    const agent = await coppice.signIn(ACCOUNTS.analyst);
    const res = await agent
      .post('/auth/logout')
      .set('origin', 'http://evil.example')
      .set('accept', 'application/json');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('cross_site_request');
    expect((await agent.get('/api/me')).status).toBe(200);
  });
});
