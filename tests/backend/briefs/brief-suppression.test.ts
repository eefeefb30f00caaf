import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computeTeamBriefs, riskBandOf } from '../../../backend/src/analysis/team-briefs';
import { fitTree } from '../../../backend/src/modeling/fit';
import { buildTable } from '../../../backend/src/modeling/table';
import { assignSegments, predict } from '../../../backend/src/modeling/tree-json';
import type { TeamBrief } from '../../../shared/briefs';

// Property tests of whole briefs over random organisations: for every manager, take every figure
// their briefs show, as the set of employees it counts. Small-cell suppression (US CMS cell size
// suppression policy: 1 to k − 1 withheld) and complementary suppression (Statistics Netherlands,
// 2010; Chu, IEEE TKDE 9(4), 1997) together mean that no sum or difference of those figures, and
// no linear combination at all, equals a group of 1 to k − 1 employees.

type Org = {
  teams: { department: number; manager: number; rows: { x: number; c: string; left: boolean }[] }[];
  k: number;
};

const organisation: fc.Arbitrary<Org> = fc.record({
  teams: fc.array(
    fc.record({
      department: fc.integer({ min: 0, max: 1 }),
      manager: fc.integer({ min: 0, max: 2 }),
      rows: fc.array(
        fc.record({ x: fc.integer({ min: 0, max: 9 }), c: fc.constantFrom('a', 'b'), left: fc.boolean() }),
        { minLength: 1, maxLength: 12 },
      ),
    }),
    { minLength: 1, maxLength: 5 },
  ),
  k: fc.integer({ min: 2, max: 6 }),
});

type Figure = { name: string; value: number; rows: Set<number> };

function briefsOf(org: Org) {
  const rows = org.teams.flatMap((team, t) => team.rows.map((row) => ({ ...row, t })));
  const labels = rows.map((r) => (r.left ? 1 : 0));
  const features = [
    { name: 'x', kind: 'numeric' as const, values: rows.map((r) => r.x) },
    { name: 'c', kind: 'categorical' as const, values: rows.map((r) => r.c) },
  ];
  const table = buildTable(features);
  const { tree } = fitTree(table, labels, { maxDepth: 2, minLeaf: 2, k: 2 });
  const computed = computeTeamBriefs(
    {
      labels,
      features,
      teams: rows.map((r) => `Team ${r.t}`),
      departments: rows.map((r) => `Dept ${org.teams[r.t]!.department}`),
      managerEmails: rows.map((r) => `m${org.teams[r.t]!.manager}@example.test`),
    },
    { tree, drivers: [] },
    { k: org.k, blockedFields: [], window: null, publishedAt: '2026-01-01T00:00:00.000Z' },
  );
  return { rows, labels, table, tree, computed };
}

/** Every figure one manager sees, each with the employees (row numbers) it counts. */
function visibleFigures(org: Org, manager: number): Figure[] {
  const { rows, labels, table, tree, computed } = briefsOf(org);
  const orgRate = labels.reduce<number>((a, b) => a + b, 0) / labels.length;
  const prediction = predict(tree, table);
  const segment = assignSegments(tree, table);
  const all = rows.map((_, i) => i);
  const where = (test: (i: number) => boolean) => new Set(all.filter(test));
  const figures: Figure[] = [];
  const add = (name: string, value: unknown, members: Set<number>) => {
    if (typeof value === 'number') figures.push({ name, value, rows: members });
  };
  for (const team of computed.filter((c) => c.managerEmail === `m${manager}@example.test`)) {
    const t = Number(team.name.replace('Team ', ''));
    const inTeam = (i: number) => rows[i]!.t === t;
    expect(team.withheld).toBe(team.brief.withheld);
    if (team.brief.withheld) continue;
    const brief = team.brief as TeamBrief;
    add(`${team.name} headcount`, brief.figures.team.headcount, where(inTeam));
    add(
      `${team.name} leavers`,
      brief.figures.team.leavers,
      where((i) => inTeam(i) && labels[i] === 1),
    );
    for (const band of brief.riskBands.bands)
      add(
        `${team.name} ${band.band}`,
        band.employees,
        where((i) => inTeam(i) && riskBandOf(prediction[i]!, orgRate) === band.band),
      );
    for (const s of brief.segments)
      add(
        `${team.name} segment ${s.id}`,
        s.employees,
        where((i) => inTeam(i) && segment[i] === s.id),
      );
    const d = org.teams[t]!.department;
    const inDept = (i: number) => org.teams[rows[i]!.t]!.department === d;
    add(`Dept ${d} headcount`, brief.figures.department!.headcount, where(inDept));
    add(
      `Dept ${d} leavers`,
      brief.figures.department!.leavers,
      where((i) => inDept(i) && labels[i] === 1),
    );
    add('organisation headcount', brief.figures.organisation.headcount, new Set(all));
    add(
      'organisation leavers',
      brief.figures.organisation.leavers,
      where((i) => labels[i] === 1),
    );
    for (const group of [brief.figures.team, brief.figures.department!, brief.figures.organisation]) {
      const rateShown = typeof group.attritionRate === 'number';
      expect(rateShown).toBe(typeof group.headcount === 'number' && typeof group.leavers === 'number');
    }
  }
  const unique = new Map(figures.map((f) => [f.name, f]));
  return [...unique.values()];
}

/** Groups of 1 to k − 1 employees whose size follows from the figures by sums and differences of up to three. */
function smallSumsAndDifferences(figures: Figure[], k: number): string[] {
  const found: string[] = [];
  const check = (terms: [Figure, number][]) => {
    const weight = new Map<number, number>();
    for (const [figure, sign] of terms)
      for (const r of figure.rows) weight.set(r, (weight.get(r) ?? 0) + sign);
    const values = [...weight.values()];
    if (!values.every((w) => w === 0 || w === 1)) return;
    const size = values.filter((w) => w === 1).length;
    if (size >= 1 && size < k) found.push(terms.map(([f, s]) => `${s > 0 ? '+' : '−'}${f.name}`).join(' '));
  };
  figures.forEach((a, i) => {
    check([[a, 1]]);
    figures.slice(i + 1).forEach((b, j) => {
      for (const sb of [1, -1]) {
        check([
          [a, 1],
          [b, sb],
        ]);
        check([
          [a, -1],
          [b, sb],
        ]);
        for (const c of figures.slice(i + j + 2))
          for (const sc of [1, -1]) {
            check([
              [a, 1],
              [b, sb],
              [c, sc],
            ]);
            check([
              [a, -1],
              [b, sb],
              [c, sc],
            ]);
          }
      }
    });
  });
  return found;
}

/**
 * Every union of 1 to k − 1 employees that lies in the linear span of the figures. Employees that
 * every figure treats alike form one atom; a union of atoms is in the span when its indicator is.
 */
function workedOutSmallGroups(figures: Figure[], k: number, rowCount: number): number[][] {
  const signature = new Map<string, number[]>();
  for (let r = 0; r < rowCount; r++) {
    const key = figures.map((f) => (f.rows.has(r) ? '1' : '0')).join('');
    if (!key.includes('1')) continue;
    signature.set(key, [...(signature.get(key) ?? []), r]);
  }
  const atoms = [...signature.entries()].map(([key, members]) => ({ key, size: members.length, members }));
  // Row-reduce the figures' vectors over the atoms.
  const basis: number[][] = [];
  for (let f = 0; f < figures.length; f++) {
    const row = atoms.map((a) => (a.key[f] === '1' ? 1 : 0));
    for (const b of basis) {
      const p = b.findIndex((x) => Math.abs(x) > 1e-9);
      if (Math.abs(row[p]!) > 1e-9) {
        const factor = row[p]! / b[p]!;
        for (let j = 0; j < row.length; j++) row[j]! -= factor * b[j]!;
      }
    }
    if (row.some((x) => Math.abs(x) > 1e-9)) basis.push(row);
  }
  const inSpan = (vector: number[]) => {
    const rest = [...vector];
    for (const b of basis) {
      const p = b.findIndex((x) => Math.abs(x) > 1e-9);
      const factor = rest[p]! / b[p]!;
      if (factor !== 0) for (let j = 0; j < rest.length; j++) rest[j]! -= factor * b[j]!;
    }
    return rest.every((x) => Math.abs(x) < 1e-7);
  };
  const found: number[][] = [];
  const chosen: number[] = [];
  const search = (start: number, size: number) => {
    for (let i = start; i < atoms.length; i++) {
      if (size + atoms[i]!.size >= k) continue;
      chosen.push(i);
      if (inSpan(atoms.map((_, j) => (chosen.includes(j) ? 1 : 0))))
        found.push(chosen.flatMap((j) => atoms[j]!.members));
      search(i + 1, size + atoms[i]!.size);
      chosen.pop();
    }
  };
  search(0, 0);
  return found;
}

describe('team briefs over random organisations', () => {
  it('never let one manager add or subtract what they see into a group of 1 to k − 1 employees', () => {
    fc.assert(
      fc.property(organisation, (org) => {
        const rowCount = org.teams.reduce((s, t) => s + t.rows.length, 0);
        for (const manager of [0, 1, 2]) {
          const figures = visibleFigures(org, manager);
          for (const f of figures) {
            expect(f.value).toBe(f.rows.size);
            expect(f.value === 0 || f.value >= org.k).toBe(true);
          }
          expect(smallSumsAndDifferences(figures, org.k)).toEqual([]);
          expect(workedOutSmallGroups(figures, org.k, rowCount)).toEqual([]);
        }
      }),
      { numRuns: Number(process.env.SUPPRESSION_RUNS ?? 100) },
    );
  });
});
