import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../backend/src/app';
import { ConfigError, loadConfig } from '../../../backend/src/lib/config';
import { sessionCookie, startSignIn } from '../../helpers/sign-in';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
let sessionPool: pg.Pool;
beforeAll(async () => {
  coppice = await startTestCoppice();
  sessionPool = new pg.Pool({ connectionString: coppice.databaseUrl, max: 2 });
});
afterAll(async () => {
  await sessionPool?.end();
  await coppice?.stop();
});

/**
 * The same app as in production behind a TLS-terminating proxy (production settings and
 * TRUST_PROXY=1) on this test's database and secrets. A sign-in started at the test app is
 * finished here, so the session is created with production's cookie options.
 */
function productionApp() {
  const config = { ...coppice.config, env: 'production' as const, production: true, trustProxy: '1' };
  return createApp({ config, sessionPool, mailSink: false });
}

async function finishSignInInProduction(viaHttps: boolean) {
  const steps = await startSignIn(coppice, ACCOUNTS.analyst, 'quillfern-demo');
  const callback = request(productionApp())
    .get(steps.callbackUrl!.pathname + steps.callbackUrl!.search)
    .set('cookie', sessionCookie(steps.agent));
  return viaHttps ? callback.set('x-forwarded-proto', 'https') : callback;
}

describe('session cookies in production', () => {
  it('marks the session cookie Secure, httpOnly and SameSite=Lax over https behind the proxy', async () => {
    const res = await finishSignInInProduction(true);
    expect(res.status).toBe(302);
    const setCookie = String(res.headers['set-cookie']);
    expect(setCookie).toMatch(/coppice\.sid=/);
    expect(setCookie).toMatch(/;\s*Secure/i);
    expect(setCookie).toMatch(/HttpOnly/i);
    expect(setCookie).toMatch(/SameSite=Lax/i);
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
  });

  it('never sends the session cookie over plain http', async () => {
    const res = await finishSignInInProduction(false);
    expect(res.status).toBe(302);
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('refuses to start in production without its own identity provider, SMTP and secrets', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(ConfigError);
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(/SESSION_SECRET[\s\S]*OIDC_ISSUER/);
  });
});

describe('requests from another site', () => {
  it('refuses a cross-site policy change (wrong Origin, no token) and changes nothing', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const before = await privacy.get('/api/policy');
    const res = await privacy
      .put('/api/policy')
      .set('origin', 'https://attacker.example')
      .send({ k: 9, blockedFields: ['Gender'], proxyThreshold: 0.5, retentionDays: 365, reason: 'forged' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('cross_site_request');
    expect((await privacy.get('/api/policy')).body).toEqual(before.body);
  });

  it('refuses a request the browser marks as cross-site even without an Origin header', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const res = await privacy
      .put('/api/policy')
      .set('sec-fetch-site', 'cross-site')
      .send({ k: 9, blockedFields: [], proxyThreshold: 0.5, retentionDays: 365, reason: 'forged' });
    expect(res.status).toBe(403);
  });

  it('accepts the same change from our own origin', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const res = await privacy
      .put('/api/policy')
      .set('origin', coppice.config.appUrl)
      .set('sec-fetch-site', 'same-origin')
      .send({ k: 7, blockedFields: [], proxyThreshold: 0.5, retentionDays: 365, reason: 'own page' });
    expect(res.status).toBe(200);
    expect(res.body.k).toBe(7);
  });
});

describe('security headers on pages and API', () => {
  it('sends the helmet headers on an API answer', async () => {
    const res = await request(coppice.app).get('/api/health');
    expect(res.headers['content-security-policy']).toMatch(/script-src 'self'/);
    expect(res.headers['content-security-policy']).toMatch(/frame-ancestors 'none'/);
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});
