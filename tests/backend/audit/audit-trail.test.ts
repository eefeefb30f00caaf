import { randomUUID } from 'node:crypto';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recordAudit } from '../../../backend/src/modules/audit/audit.repository';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
let privacy: request.Agent;
beforeAll(async () => {
  coppice = await startTestCoppice();
  privacy = await coppice.signIn(ACCOUNTS.privacy);
});
afterAll(async () => {
  await coppice?.stop();
});

/** Audit lines of a dataset made up for one test, so tests do not see each other's lines. */
async function datasetLines(actions: string[], actorEmail = 'analyst@quillfern.example') {
  const objectId = randomUUID();
  for (const action of actions) {
    await recordAudit({
      actor: { id: randomUUID(), email: actorEmail },
      action,
      objectType: 'dataset',
      objectId,
    });
  }
  return objectId;
}

describe('GET /api/audit', () => {
  it('lists the trail newest first, with sign-ins in it', async () => {
    const res = await privacy.get('/api/audit');
    expect(res.status).toBe(200);
    expect(res.body.page).toBe(1);
    expect(
      res.body.items.some(
        (e: { action: string; actorEmail: string }) =>
          e.action === 'auth.sign_in' && e.actorEmail === ACCOUNTS.privacy,
      ),
    ).toBe(true);
    const times = res.body.items.map((e: { at: string }) => Date.parse(e.at));
    expect(times).toEqual([...times].sort((a, b) => b - a));
  });

  it('filters by object and action and pages through the result', async () => {
    const objectId = await datasetLines(['dataset.upload', 'dataset.mapping', 'dataset.approve']);
    const all = await privacy.get('/api/audit').query({ objectType: 'dataset', objectId });
    expect(all.body.total).toBe(3);
    expect(all.body.items.map((e: { action: string }) => e.action)).toEqual([
      'dataset.approve',
      'dataset.mapping',
      'dataset.upload',
    ]);

    const second = await privacy.get('/api/audit').query({ objectId, pageSize: 2, page: 2 });
    expect(second.body).toMatchObject({ total: 3, page: 2, pageSize: 2 });
    expect(second.body.items.map((e: { action: string }) => e.action)).toEqual(['dataset.upload']);

    const mapping = await privacy.get('/api/audit').query({ objectId, action: 'dataset.map' });
    expect(mapping.body.items.map((e: { action: string }) => e.action)).toEqual(['dataset.mapping']);
  });

  it('filters by actor e-mail and by time range', async () => {
    const actor = `someone-${randomUUID().slice(0, 8)}@quillfern.example`;
    await datasetLines(['dataset.delete'], actor);
    const byActor = await privacy.get('/api/audit').query({ actor: actor.slice(0, 16).toUpperCase() });
    expect(byActor.body.total).toBe(1);

    const future = new Date(Date.now() + 3_600_000).toISOString();
    const past = new Date(Date.now() - 3_600_000).toISOString();
    expect((await privacy.get('/api/audit').query({ actor, from: future })).body.total).toBe(0);
    expect((await privacy.get('/api/audit').query({ actor, to: past })).body.total).toBe(0);
    expect((await privacy.get('/api/audit').query({ actor, from: past, to: future })).body.total).toBe(1);
  });

  it('rejects a bad filter with 400 naming it', async () => {
    const res = await privacy.get('/api/audit').query({ pageSize: 1000, from: 'yesterday' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['pageSize', 'from']));
  });

  it('is for privacy officers only', async () => {
    for (const email of [ACCOUNTS.analyst, ACCOUNTS.managerNorth]) {
      const agent = await coppice.signIn(email);
      expect((await agent.get('/api/audit')).status).toBe(403);
      expect((await agent.get('/api/audit/export.csv')).status).toBe(403);
    }
  });
});

describe('GET /api/audit/export.csv', () => {
  it('exports the filtered trail as CSV whose cells cannot run as formulas, and audits the export', async () => {
    const objectId = await datasetLines(
      ['=HYPERLINK("http://example.invalid","open")', 'dataset.upload'],
      '@evil@example.org',
    );
    const res = await privacy.get('/api/audit/export.csv').query({ objectId });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(
      /attachment; filename="?coppice-audit-trail-\d{4}-\d{2}-\d{2}\.csv/,
    );
    const lines = res.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split('\r\n');
    expect(lines[0]).toBe('id,time (UTC),actor,action,object type,object id,details');
    expect(lines).toHaveLength(3);
    // OWASP CSV injection guidance: a leading = + - @ is neutralised with a quote.
    expect(lines[1]).toContain(`'@evil@example.org`);
    expect(res.text).toContain(`"'=HYPERLINK(""http://example.invalid"",""open"")"`);
    for (const line of lines.slice(1)) {
      for (const cell of line.split(',')) expect(cell).not.toMatch(/^"?[=+\-@\t\r]/);
    }
    const [exported] = await coppice.sql<{ details: { rows: number; filter: Record<string, string> } }>(
      `SELECT details FROM audit_events WHERE action = 'audit.export' ORDER BY id DESC LIMIT 1`,
    );
    expect(exported!.details).toMatchObject({ rows: 2, filter: { objectId } });
  });
});

describe('the audit trail table', () => {
  it('cannot be changed or emptied: PostgreSQL refuses UPDATE, DELETE and TRUNCATE', async () => {
    await datasetLines(['dataset.upload']);
    await expect(coppice.sql(`UPDATE audit_events SET action = 'nothing happened'`)).rejects.toThrow(
      /append-only/,
    );
    await expect(coppice.sql(`DELETE FROM audit_events`)).rejects.toThrow(/append-only/);
    await expect(coppice.sql(`TRUNCATE audit_events`)).rejects.toThrow(/append-only/);
    expect(
      (await coppice.sql<{ n: number }>(`SELECT count(*)::int AS n FROM audit_events`))[0]!.n,
    ).toBeGreaterThan(0);
  });
});
