import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
beforeAll(async () => {
  coppice = await startTestCoppice();
});
afterAll(async () => {
  await coppice?.stop();
});

describe('when the identity provider is down', () => {
  it('keeps signed-in sessions working and tells new visitors clearly that sign-in is unavailable', async () => {
    const agent = await coppice.signIn(ACCOUNTS.analyst);
    await coppice.local.idp!.stop();

    const me = await agent.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.email).toBe(ACCOUNTS.analyst);

    const login = await request(coppice.app).get('/auth/login?returnTo=/');
    expect(login.status).toBe(503);
    expect(login.headers['content-type']).toMatch(/html/);
    expect(login.text).toContain('Sign-in is unavailable');
    expect(login.text).toContain('cannot be reached');
  });
});

describe('an expired session', () => {
  it('gets 401 once the session has expired in the store', async () => {
    const fresh = await startTestCoppice();
    try {
      const agent = await fresh.signIn(ACCOUNTS.privacy);
      expect((await agent.get('/api/me')).status).toBe(200);
      await fresh.sql("UPDATE session SET expire = now() - interval '1 minute'");
      const res = await agent.get('/api/me');
      expect(res.status).toBe(401);
    } finally {
      await fresh.stop();
    }
  });
});
