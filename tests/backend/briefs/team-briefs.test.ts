import { describe, expect, it } from 'vitest';
import { computeTeamBriefs } from '../../../backend/src/analysis/team-briefs';
import { DEMO_MANAGER_NORTH } from '../../../backend/src/demo/quillfern';
import { CAUTION_TEXT } from '../../../frontend/src/components/caution';
import { BRIEF_CAUTION, type TeamBrief } from '../../../shared/briefs';
import { demoBriefInputs } from './demo-inputs';

const settings = { k: 5, blockedFields: [], window: null, publishedAt: '2026-10-15T09:00:00.000Z' };

describe('computing the team briefs of the invented demo organisation', () => {
  const { columns, model } = demoBriefInputs({ rows: 600 });
  const teams = computeTeamBriefs(columns, model, settings);

  it('gives every team a brief, and the teams of fewer than k employees only the withheld statement', () => {
    expect(teams.map((t) => t.name).sort()).toEqual([...new Set(columns.teams)].sort());
    const sizes = new Map<string, number>();
    for (const team of columns.teams) sizes.set(team!, (sizes.get(team!) ?? 0) + 1);
    for (const team of teams) {
      expect(team.withheld).toBe(sizes.get(team.name)! < 5);
      if (team.withheld) {
        expect(team.brief).toMatchObject({
          withheld: true,
          message: expect.stringMatching(/^withheld: fewer than 5/),
        });
        expect(team.headcount).toBeNull();
      }
    }
    expect(teams.filter((t) => t.withheld).map((t) => t.name)).toEqual(
      expect.arrayContaining(['Harrowfield Night Crew', 'Marshgate Relief Crew']),
    );
  });

  it("gives manager.north's teams, one of them too small, to manager.north", () => {
    const north = teams.filter((t) => t.managerEmail === DEMO_MANAGER_NORTH);
    expect(north.map((t) => [t.name, t.withheld])).toEqual(
      expect.arrayContaining([
        ['Alderbrook Crew 1', false],
        ['Alderbrook Crew 2', false],
        ['Harrowfield Night Crew', true],
      ]),
    );
  });

  it('writes the drivers in plain words with direction and size in points', () => {
    const brief = teams.find((t) => !t.withheld)!.brief as TeamBrief;
    expect(brief.drivers.length).toBeGreaterThan(0);
    for (const driver of brief.drivers) {
      if (driver.direction === 'raises')
        expect(driver.sentence).toBe(
          `${driver.feature} raises the expected leaver share of this team by about ${driver.points} point${driver.points === 1 ? '' : 's'} over the organisation.`,
        );
      if (driver.direction === 'about the same') expect(driver.points).toBe(0);
    }
  });

  it('carries the caution, in the same words the screens show', () => {
    expect(BRIEF_CAUTION).toBe(CAUTION_TEXT);
    for (const team of teams) expect(team.brief.caution).toBe(BRIEF_CAUTION);
  });

  it('refuses a model that splits on a blocked field', () => {
    const used = JSON.stringify(model.tree).match(/"feature":"([^"]+)"/)![1]!;
    expect(() => computeTeamBriefs(columns, model, { ...settings, blockedFields: [used] })).toThrow(
      /blocked/,
    );
  });
});
