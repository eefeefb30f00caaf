import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  currentPolicy,
  onPolicyChange,
  type PolicyChange,
} from '../../../backend/src/modules/policy/policy.service';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
beforeAll(async () => {
  coppice = await startTestCoppice();
});
afterAll(async () => {
  await coppice?.stop();
});

const valid = {
  k: 7,
  blockedFields: ['Date of Birth', 'Gender'],
  proxyThreshold: 0.4,
  retentionDays: 400,
  reason: 'Works council agreement of March',
};

describe('GET /api/policy', () => {
  it('starts from the defaults (k 5, nothing blocked, threshold 0.5, one year) as version 1', async () => {
    const analyst = await coppice.signIn(ACCOUNTS.analyst);
    const res = await analyst.get('/api/policy');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      version: 1,
      k: 5,
      blockedFields: [],
      proxyThreshold: 0.5,
      retentionDays: 365,
    });
  });

  it('is not for managers', async () => {
    const manager = await coppice.signIn(ACCOUNTS.managerNorth);
    expect((await manager.get('/api/policy')).status).toBe(403);
  });
});

describe('PUT /api/policy', () => {
  it('lets a privacy officer change the policy as a new version with author, time and reason, and audits it', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const before = (await privacy.get('/api/policy')).body;
    const res = await privacy.put('/api/policy').send(valid);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      version: before.version + 1,
      k: 7,
      blockedFields: ['Date of Birth', 'Gender'],
      proxyThreshold: 0.4,
      retentionDays: 400,
      reason: valid.reason,
      authorEmail: ACCOUNTS.privacy,
    });
    expect(Date.parse(res.body.createdAt)).not.toBeNaN();

    const history = (await privacy.get('/api/policy/versions')).body;
    expect(history[0].version).toBe(res.body.version);
    expect(history.at(-1)).toMatchObject({ version: 1, k: 5 });

    const [line] = await coppice.sql<{
      actor_email: string;
      object_id: string;
      details: Record<string, unknown>;
    }>(
      `SELECT actor_email, object_id, details FROM audit_events WHERE action = 'policy.change' ORDER BY id DESC LIMIT 1`,
    );
    expect(line).toMatchObject({ actor_email: ACCOUNTS.privacy, object_id: String(res.body.version) });
    expect(line!.details).toMatchObject({ reason: valid.reason, k: { from: before.k, to: 7 } });
  });

  it('refuses analysts and managers with 403 and leaves the policy as it was', async () => {
    const before = await currentPolicy();
    for (const email of [ACCOUNTS.analyst, ACCOUNTS.managerSouth]) {
      const agent = await coppice.signIn(email);
      const res = await agent.put('/api/policy').send({ ...valid, k: 9 });
      expect(res.status).toBe(403);
    }
    expect(await currentPolicy()).toEqual(before);
  });

  it.each([
    ['k', { k: 1 }],
    ['k', { k: 101 }],
    ['k', { k: 5.5 }],
    ['proxyThreshold', { proxyThreshold: 0.05 }],
    ['proxyThreshold', { proxyThreshold: 0.95 }],
    ['retentionDays', { retentionDays: 29 }],
    ['retentionDays', { retentionDays: 3651 }],
    ['blockedFields', { blockedFields: 'Gender' }],
    ['reason', { reason: '' }],
  ])('rejects a bad %s with 400 naming the field, and keeps the policy', async (field, change) => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const before = await currentPolicy();
    const res = await privacy.put('/api/policy').send({ ...valid, ...change });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(field);
    expect(JSON.stringify(res.body.error.details)).toContain(field);
    expect(await currentPolicy()).toEqual(before);
  });

  it('requires a reason', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const { reason: _reason, ...withoutReason } = valid;
    const res = await privacy.put('/api/policy').send({ ...withoutReason, k: 8 });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ path: 'reason' });
  });

  it('does not make a new version when nothing changes', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const current = await currentPolicy();
    const res = await privacy.put('/api/policy').send({
      k: current.k,
      blockedFields: [...current.blockedFields].reverse(),
      proxyThreshold: current.proxyThreshold,
      retentionDays: current.retentionDays,
      reason: 'Same again',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('policy_unchanged');
    expect((await currentPolicy()).version).toBe(current.version);
  });

  it('tells listeners what changed (k raised, fields newly blocked) inside the change', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const seen: PolicyChange[] = [];
    const stop = onPolicyChange(async (change) => {
      seen.push(change);
    });
    try {
      const before = await currentPolicy();
      const res = await privacy.put('/api/policy').send({
        ...valid,
        k: before.k + 1,
        blockedFields: [...before.blockedFields, 'Ethnicity'],
        reason: 'Add ethnicity',
      });
      expect(res.status).toBe(200);
      expect(seen).toHaveLength(1);
      expect(seen[0]).toMatchObject({ kRaised: true, newlyBlocked: ['Ethnicity'], unblocked: [] });
      expect(seen[0]!.previous.version).toBe(before.version);
    } finally {
      stop();
    }
  });

  it('rolls the whole change back when a listener fails', async () => {
    const privacy = await coppice.signIn(ACCOUNTS.privacy);
    const before = await currentPolicy();
    const auditLines = (
      await coppice.sql(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'policy.change'`)
    )[0]!.n;
    const stop = onPolicyChange(async () => {
      throw new Error('withdrawing briefs failed');
    });
    try {
      const res = await privacy.put('/api/policy').send({ ...valid, k: before.k + 2, reason: 'Will fail' });
      expect(res.status).toBe(500);
    } finally {
      stop();
    }
    expect(await currentPolicy()).toEqual(before);
    expect(
      (await coppice.sql(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'policy.change'`))[0]!.n,
    ).toBe(auditLines);
  });

  it('keeps every version: PostgreSQL refuses to edit or delete one', async () => {
    await expect(coppice.sql(`UPDATE policy_versions SET k = 2 WHERE version = 1`)).rejects.toThrow(
      /keeps every version/,
    );
    await expect(coppice.sql(`DELETE FROM policy_versions WHERE version = 1`)).rejects.toThrow(
      /keeps every version/,
    );
  });
});
