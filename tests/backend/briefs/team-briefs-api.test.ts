import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_MANAGER_NORTH, DEMO_MANAGER_SOUTH } from '../../../backend/src/demo/quillfern';
import type { PublicationResponse, TeamBrief, TeamSummary } from '../../../shared/briefs';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { DEMO_BLOCKED, demoAction } from './demo-inputs';
import { useDemoRuns } from './demo-sources';

let coppice: TestCoppice;
let demo: Awaited<ReturnType<typeof useDemoRuns>>;
let privacy: request.Agent;
let analyst: request.Agent;
let north: request.Agent;
let south: request.Agent;

async function waitForPublication(runId: string, status = 'published'): Promise<PublicationResponse> {
  for (let i = 0; i < 300; i++) {
    const list = (await privacy.get(`/api/models/${runId}/publications`)).body as PublicationResponse[];
    const found = list.find((p) => p.status !== 'computing');
    if (found) {
      expect(found.status).toBe(status);
      return found;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the briefs were not computed in time');
}

let firstRun: string;
let blocked: string[];
let firstPublication: PublicationResponse;

beforeAll(async () => {
  coppice = await startTestCoppice();
  privacy = await coppice.signIn(ACCOUNTS.privacy);
  analyst = await coppice.signIn(ACCOUNTS.analyst);
  demo = await useDemoRuns(analyst, privacy);
  blocked = demo.protectedColumns;
  const policy = await privacy.put('/api/policy').send({
    k: 5,
    blockedFields: blocked,
    proxyThreshold: 0.5,
    retentionDays: 365,
    reason: 'Block protected fields',
  });
  expect(policy.status).toBe(200);
  north = await coppice.signIn(ACCOUNTS.managerNorth);
  south = await coppice.signIn(ACCOUNTS.managerSouth);
  firstRun = await demo.requestedRun();
  const res = await privacy.post(`/api/models/${firstRun}/publish`).send({ comment: 'First quarter' });
  expect(res.status).toBe(202);
  expect(res.body).toMatchObject({ status: 'computing', modelRunId: firstRun });
  firstPublication = await waitForPublication(firstRun);
}, 60_000);

afterAll(async () => {
  await coppice?.stop();
});

describe('POST /api/models/:id/publish', () => {
  it('computes a brief for every team of the dataset and tells the model run it is published', async () => {
    const teams = new Set(demo.columns.teams.filter(Boolean));
    expect(firstPublication.teamCount).toBe(teams.size);
    const stored = await coppice.sql<{ n: string }>(
      'SELECT count(*) AS n FROM team_briefs WHERE publication_id = $1',
      [firstPublication.id],
    );
    expect(Number(stored[0]!.n)).toBe(teams.size);
    expect((await analyst.get(`/api/models/${firstRun}`)).body.publicationState).toBe('published');
    const audit = await coppice.sql('SELECT action FROM audit_events WHERE object_id = $1 ORDER BY id', [
      firstPublication.id,
    ]);
    expect(audit.map((a) => a.action)).toEqual(['briefs.publish', 'briefs.published']);
  });

  it('is for privacy officers only', async () => {
    const run = firstRun;
    expect((await analyst.post(`/api/models/${run}/publish`).send({})).status).toBe(403);
    expect((await north.post(`/api/models/${run}/publish`).send({})).status).toBe(403);
  });

  it('refuses a run whose publication was not requested, and an unknown run', async () => {
    const run = await demo.requestedRun(false);
    const res = await privacy.post(`/api/models/${run}/publish`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/request/);
    expect(
      (await privacy.post('/api/models/00000000-0000-4000-8000-000000000000/publish').send({})).status,
    ).toBe(404);
  });
});

describe('GET /api/teams', () => {
  it('gives a manager only the teams whose manager e-mail is theirs, the small one withheld with no figures', async () => {
    const res = await north.get('/api/teams');
    expect(res.status).toBe(200);
    const teams = res.body as TeamSummary[];
    expect(teams.map((t) => t.name).sort()).toEqual(
      ['Alderbrook Crew 1', 'Alderbrook Crew 2', 'Harrowfield Night Crew'].sort(),
    );
    const small = teams.find((t) => t.name === 'Harrowfield Night Crew')!;
    expect(small).toMatchObject({ withheld: true, headcount: null });
    expect(small).not.toHaveProperty('attritionRate');
    for (const team of teams.filter((t) => !t.withheld)) expect(team.headcount).toBeGreaterThanOrEqual(5);
  });

  it('gives analysts and privacy officers every team, for preview', async () => {
    const all = (await analyst.get('/api/teams')).body as TeamSummary[];
    expect(all).toHaveLength(firstPublication.teamCount!);
    expect(all.filter((t) => t.withheld).map((t) => t.name)).toEqual(
      expect.arrayContaining(['Harrowfield Night Crew', 'Marshgate Relief Crew']),
    );
    expect((await privacy.get('/api/teams')).body).toHaveLength(all.length);
  });
});

describe('GET /api/teams/:id/brief', () => {
  it("shows a manager their team's brief and audits the view", async () => {
    const teams = (await north.get('/api/teams')).body as TeamSummary[];
    const team = teams.find((t) => t.name === 'Alderbrook Crew 1')!;
    const res = await north.get(`/api/teams/${team.id}/brief`);
    expect(res.status).toBe(200);
    const brief = res.body as TeamBrief;
    expect(brief).toMatchObject({ withheld: false, team: { id: team.id, name: 'Alderbrook Crew 1' }, k: 5 });
    expect(brief.figures.team.headcount).toBe(team.headcount);
    expect(brief.figures.organisation.headcount).toBe(demo.columns.labels.length);
    expect(brief.window).toEqual({ start: '2025-10-01', end: '2026-09-30' });
    expect(brief.drivers.length).toBeGreaterThan(0);
    for (const driver of brief.drivers) {
      expect(driver.suggestedAction).toBe(demoAction(driver.feature));
      expect(driver.sentence).toContain(driver.feature);
    }
    expect(brief.caution).toMatch(/must not be used for decisions about individuals/);
    const audit = await coppice.sql(
      `SELECT actor_email, details FROM audit_events WHERE action = 'brief.view' AND object_id = $1`,
      [team.id],
    );
    expect(audit).toEqual([
      {
        actor_email: DEMO_MANAGER_NORTH,
        details: expect.objectContaining({ preview: false, format: 'json' }),
      },
    ]);
  });

  it('gives a withheld team only the statement, no figures', async () => {
    const teams = (await north.get('/api/teams')).body as TeamSummary[];
    const small = teams.find((t) => t.withheld)!;
    const res = await north.get(`/api/teams/${small.id}/brief`);
    expect(res.status).toBe(200);
    expect(Object.keys(res.body).sort()).toEqual([
      'caution',
      'k',
      'message',
      'publishedAt',
      'team',
      'withheld',
    ]);
    expect(res.body.message).toMatch(/^withheld: fewer than 5 employees/);
  });

  it("refuses another manager's team, and any unknown id, with the same 403", async () => {
    const southTeams = (await south.get('/api/teams')).body as TeamSummary[];
    expect(southTeams.length).toBeGreaterThan(0);
    for (const id of [southTeams[0]!.id, '00000000-0000-4000-8000-000000000000', 'not-an-id']) {
      const res = await north.get(`/api/teams/${id}/brief`);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('not_your_team');
      expect((await north.get(`/api/teams/${id}/brief.csv`)).status).toBe(403);
    }
    const refused = await coppice.sql(
      `SELECT count(*)::int AS n FROM audit_events WHERE action = 'brief.refused'`,
    );
    expect(refused[0]!.n).toBeGreaterThanOrEqual(6);
  });

  it('lets analysts and privacy officers preview any brief exactly as its manager sees it', async () => {
    const own = ((await south.get('/api/teams')).body as TeamSummary[])[0]!;
    const asManager = (await south.get(`/api/teams/${own.id}/brief`)).body;
    const asAnalyst = await analyst.get(`/api/teams/${own.id}/brief`);
    expect(asAnalyst.status).toBe(200);
    expect(asAnalyst.body).toEqual(asManager);
    const audit = await coppice.sql(
      `SELECT details FROM audit_events WHERE action = 'brief.view' AND actor_email = $1`,
      [ACCOUNTS.analyst],
    );
    expect(audit.at(-1)!.details).toMatchObject({ preview: true });
  });

  it('answers many managers at once (the reads are batched) with each their own, and audits every view', async () => {
    const northTeam = ((await north.get('/api/teams')).body as TeamSummary[]).find((t) => !t.withheld)!;
    const southAll = ((await south.get('/api/teams')).body as TeamSummary[]).map((t) => t.id).sort();
    const southTeam = ((await south.get('/api/teams')).body as TeamSummary[]).find((t) => !t.withheld)!;
    const before = await coppice.sql<{ actor_email: string; object_id: string; n: number }>(
      `SELECT actor_email, object_id, count(*)::int AS n FROM audit_events WHERE action = 'brief.view' GROUP BY 1, 2`,
    );
    const views = (email: string, id: string) =>
      before.find((row) => row.actor_email === email && row.object_id === id)?.n ?? 0;
    // 60 requests in flight together: own briefs, the other manager's brief, team lists.
    const calls = Array.from({ length: 20 }, () => [
      north.get(`/api/teams/${northTeam.id}/brief`),
      south.get(`/api/teams/${southTeam.id}/brief`),
      north.get(`/api/teams/${southTeam.id}/brief`),
      south.get('/api/teams'),
    ]).flat();
    const answers = await Promise.all(calls);
    for (let i = 0; i < answers.length; i += 4) {
      expect(answers[i]!.status).toBe(200);
      expect(answers[i]!.body.team.id).toBe(northTeam.id);
      expect(answers[i + 1]!.status).toBe(200);
      expect(answers[i + 1]!.body.team.id).toBe(southTeam.id);
      expect(answers[i + 2]!.status).toBe(403);
      expect((answers[i + 3]!.body as TeamSummary[]).map((t) => t.id).sort()).toEqual(southAll);
    }
    const after = await coppice.sql<{ actor_email: string; object_id: string; n: number }>(
      `SELECT actor_email, object_id, count(*)::int AS n FROM audit_events WHERE action = 'brief.view' GROUP BY 1, 2`,
    );
    const viewsAfter = (email: string, id: string) =>
      after.find((row) => row.actor_email === email && row.object_id === id)?.n ?? 0;
    expect(viewsAfter(DEMO_MANAGER_NORTH, northTeam.id) - views(DEMO_MANAGER_NORTH, northTeam.id)).toBe(20);
    expect(viewsAfter(DEMO_MANAGER_SOUTH, southTeam.id) - views(DEMO_MANAGER_SOUTH, southTeam.id)).toBe(20);
    // The refused ones left no view line for the team they were not allowed to see.
    expect(viewsAfter(DEMO_MANAGER_NORTH, southTeam.id)).toBe(views(DEMO_MANAGER_NORTH, southTeam.id));
  });

  it('exports the brief as formula-safe CSV with the caution', async () => {
    const team = ((await north.get('/api/teams')).body as TeamSummary[]).find((t) => !t.withheld)!;
    const res = await north.get(`/api/teams/${team.id}/brief.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?team-brief-Alderbrook/);
    expect(res.text.split('\r\n')[0]).toBe('section,item,value,detail');
    expect(res.text).toContain('team,headcount,');
    expect(res.text).toContain('must not be used for decisions about individuals');
    for (const line of res.text.split('\r\n')) expect(line).not.toMatch(/^[=+@-]|,[=+@]/);
  });
});

describe('what managers receive', () => {
  it('holds no employee identifier, individual figure or blocked field in any response', async () => {
    const bodies: string[] = [];
    for (const manager of [north, south]) {
      const list = await manager.get('/api/teams');
      bodies.push(list.text);
      for (const team of list.body as TeamSummary[]) {
        bodies.push((await manager.get(`/api/teams/${team.id}/brief`)).text);
        bodies.push((await manager.get(`/api/teams/${team.id}/brief.csv`)).text);
      }
    }
    const all = bodies.join('\n');
    for (const identifier of demo.identifiers) expect(all).not.toContain(identifier);
    for (const field of [...DEMO_BLOCKED, ...demo.protectedFields]) expect(all).not.toContain(field);
    expect(all).not.toMatch(/QF\d{6}|employeeId|employeeKey|prediction"|"rows"|fairness/i);
    // Every count shown is 0 or at least k.
    for (const body of bodies.filter((b) => b.startsWith('{'))) {
      const brief = JSON.parse(body) as TeamBrief;
      if (brief.withheld) continue;
      const counts = [
        brief.figures.team.headcount,
        brief.figures.team.leavers,
        brief.figures.department?.headcount,
        brief.figures.department?.leavers,
        ...brief.riskBands.bands.map((b) => b.employees),
        ...brief.segments.map((s) => s.employees),
      ].filter((c): c is number => typeof c === 'number');
      for (const c of counts) expect(c === 0 || c >= 5).toBe(true);
    }
  });

  it('sends each manager with a team one short e-mail with a link and no figures', async () => {
    let mailbox: { to: string[]; subject: string; text: string }[] = [];
    const managers = new Set(demo.columns.managerEmails!.map((e) => e!.toLowerCase()));
    const briefMails = () => mailbox.filter((m) => m.subject === 'Team briefs are ready in Coppice');
    for (let i = 0; i < 200; i++) {
      mailbox = (await request(coppice.app).get('/dev/mailbox')).body;
      if (new Set(briefMails().flatMap((m) => m.to)).size >= managers.size) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(new Set(briefMails().flatMap((m) => m.to))).toEqual(managers);
    expect(managers).toContain(DEMO_MANAGER_SOUTH);
    for (const mail of briefMails()) {
      expect(mail.to).toHaveLength(1);
      expect(mail.text).toContain(`${coppice.config.appUrl}/teams`);
      expect(mail.text.replace(coppice.config.appUrl, '')).not.toMatch(/\d/);
      expect(mail.text).not.toMatch(/Crew|Alderbrook|Harrowfield/);
    }
  });
});

describe('replacing and withdrawing', () => {
  it('replaces the older publication of the same dataset with a newer one', async () => {
    const oldTeam = ((await north.get('/api/teams')).body as TeamSummary[])[0]!;
    const run = await demo.requestedRun();
    expect((await privacy.post(`/api/models/${run}/publish`).send({})).status).toBe(202);
    await waitForPublication(run);
    const teams = (await analyst.get('/api/teams')).body as TeamSummary[];
    expect(teams).toHaveLength(firstPublication.teamCount!);
    expect(teams.map((t) => t.id)).not.toContain(oldTeam.id);
    expect((await analyst.get(`/api/teams/${oldTeam.id}/brief`)).status).toBe(404);
    const old = (await privacy.get(`/api/models/${firstRun}/publications`)).body as PublicationResponse[];
    expect(old[0]!.status).toBe('replaced');
    expect((await analyst.get(`/api/models/${firstRun}`)).body.publicationState).toBe('withdrawn');
  });

  it('withdraws the briefs at once when k rises, and keeps the reason for the analyst', async () => {
    const run = (
      await coppice.sql<{ model_run_id: string }>(
        `SELECT model_run_id FROM publications WHERE status = 'published'`,
      )
    )[0]!.model_run_id;
    const res = await privacy.put('/api/policy').send({
      k: 6,
      blockedFields: blocked,
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: 'Stricter groups',
    });
    expect(res.status).toBe(200);
    expect((await analyst.get('/api/teams')).body).toEqual([]);
    expect((await north.get('/api/teams')).body).toEqual([]);
    const [publication] = (await analyst.get(`/api/models/${run}/publications`))
      .body as PublicationResponse[];
    expect(publication).toMatchObject({ status: 'withdrawn' });
    expect(publication!.withdrawnReason).toMatch(/k rose from 5 to 6/);
    const left = await coppice.sql('SELECT count(*)::int AS n FROM team_briefs');
    expect(left[0]!.n).toBe(0);
  });

  it('withdraws the briefs when a field the model uses becomes blocked', async () => {
    const run = await demo.requestedRun();
    expect((await privacy.post(`/api/models/${run}/publish`).send({})).status).toBe(202);
    await waitForPublication(run);
    const used = (
      await coppice.sql<{ features: string[] }>(`SELECT features FROM publications WHERE model_run_id = $1`, [
        run,
      ])
    )[0]!.features;
    const res = await privacy.put('/api/policy').send({
      k: 6,
      blockedFields: [...blocked, used[0]],
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: 'Block a field',
    });
    expect(res.status).toBe(200);
    const [publication] = (await privacy.get(`/api/models/${run}/publications`))
      .body as PublicationResponse[];
    expect(publication!.status).toBe('withdrawn');
    expect(publication!.withdrawnReason).toContain(used[0]);
    expect((await north.get('/api/teams')).body).toEqual([]);
  });

  it('removes every brief at once when the dataset is deleted', async () => {
    await privacy.put('/api/policy').send({
      k: 6,
      blockedFields: blocked,
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: 'Unblock again',
    });
    const run = await demo.requestedRun();
    expect((await privacy.post(`/api/models/${run}/publish`).send({})).status).toBe(202);
    await waitForPublication(run);
    expect(((await north.get('/api/teams')).body as TeamSummary[]).length).toBe(3);
    expect((await analyst.delete(`/api/datasets/${demo.datasetId}`)).status).toBeLessThan(300);
    expect((await north.get('/api/teams')).body).toEqual([]);
    const left = await coppice.sql('SELECT count(*)::int AS n FROM team_briefs');
    expect(left[0]!.n).toBe(0);
  });
});
