import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  type CountCell,
  isShown,
  type SumRelation,
  showIf,
  smallCellValue,
  suppress,
  WITHHELD,
} from '../../../backend/src/analysis/suppression';

describe('small cells', () => {
  it('shows 0, withholds 1 to 10 and shows 11 when k is 11', () => {
    // US CMS Cell Size Suppression Policy test points for k = 11.
    expect(smallCellValue(0, 11)).toBe(0);
    for (let count = 1; count <= 10; count++) expect(smallCellValue(count, 11)).toEqual(WITHHELD);
    expect(smallCellValue(11, 11)).toBe(11);
  });
});

describe('complementary suppression', () => {
  const department = (teams: Record<string, number>): { cells: CountCell[]; relations: SumRelation[] } => ({
    cells: [
      { id: 'dept', count: Object.values(teams).reduce((a, b) => a + b, 0) },
      ...Object.entries(teams).map(([id, count]) => ({ id, count })),
    ],
    relations: [{ total: 'dept', parts: Object.keys(teams) }],
  });

  it('withholds a second team so that the department total minus the shown teams does not give the small one', () => {
    const result = suppress({ k: 5, ...department({ a: 3, b: 9, c: 12 }) });
    expect([...result.primary]).toEqual(['a']);
    expect([...result.complementary]).toEqual(['b']);
    expect(isShown(result, 'dept')).toBe(true);
  });

  it('keeps withholding until the withheld teams together count at least k', () => {
    const result = suppress({ k: 10, ...department({ a: 2, b: 3, c: 4, d: 30 }) });
    // a + b + c = 9 < 10 would still be a group of fewer than k: one more cell goes.
    expect(result.withheld.has('d') || result.withheld.has('dept')).toBe(true);
  });

  it('lets the caller prefer withholding a total over a team', () => {
    const { cells, relations } = department({ a: 3, b: 9 });
    const result = suppress({
      k: 5,
      cells: cells.map((c) => (c.id === 'dept' ? { ...c, cost: 0 } : c)),
      relations,
    });
    expect([...result.withheld].sort()).toEqual(['a', 'dept']);
  });

  it('treats figures the viewer cannot see as unknown to them', () => {
    // A manager of b only sees b and the department: the department minus b is a, c together (15).
    const result = suppress({ k: 5, ...department({ a: 3, b: 9, c: 12 }), visible: ['dept', 'b'] });
    expect(result.withheld.size).toBe(0);
  });

  it('protects a team the viewer cannot see from "department minus my teams"', () => {
    const result = suppress({ k: 5, ...department({ a: 3, b: 9, c: 12 }), visible: ['dept', 'b', 'c'] });
    expect(result.withheld.size).toBe(1);
  });

  it('shows a rate only where the counts it comes from are shown', () => {
    const result = suppress({ k: 5, ...department({ a: 3, b: 9, c: 12 }) });
    expect(showIf(result, ['c'], 0.25)).toBe(0.25);
    expect(showIf(result, ['b'], 0.25)).toEqual(WITHHELD);
  });
});

// ---------------------------------------------------------------------------------------------
// Property tests over random organisations. Every figure is a count of a group of "atoms"
// (a team, or a team's risk band); a viewer learns every linear combination of the figures shown
// to them. The property: no group of 1 to k − 1 employees can be worked out, i.e. its indicator
// vector over the atoms is not in the span of the shown figures' vectors.

type Figure = { cell: CountCell; atoms: number[] };
type Organisation = { atoms: number[]; figures: Figure[]; relations: SumRelation[]; viewers: string[][] };

function rowReduce(rows: number[][]): number[][] {
  const basis: number[][] = [];
  for (const original of rows) {
    const row = [...original];
    for (const b of basis) {
      const pivot = b.findIndex((x) => Math.abs(x) > 1e-9);
      if (Math.abs(row[pivot]!) > 1e-9) {
        const factor = row[pivot]! / b[pivot]!;
        for (let j = 0; j < row.length; j++) row[j]! -= factor * b[j]!;
      }
    }
    if (row.some((x) => Math.abs(x) > 1e-9)) {
      const pivot = row.findIndex((x) => Math.abs(x) > 1e-9);
      for (const b of basis) {
        if (Math.abs(b[pivot]!) > 1e-9) {
          const factor = b[pivot]! / row[pivot]!;
          for (let j = 0; j < b.length; j++) b[j]! -= factor * row[j]!;
        }
      }
      basis.push(row);
    }
  }
  return basis;
}

function inSpan(basis: number[][], vector: number[]): boolean {
  const rest = [...vector];
  for (const b of basis) {
    const pivot = b.findIndex((x) => Math.abs(x) > 1e-9);
    const factor = rest[pivot]! / b[pivot]!;
    if (factor !== 0) for (let j = 0; j < rest.length; j++) rest[j]! -= factor * b[j]!;
  }
  return rest.every((x) => Math.abs(x) < 1e-7);
}

function vectorOf(figure: Figure, size: number): number[] {
  const vector = new Array<number>(size).fill(0);
  for (const atom of figure.atoms) vector[atom] = 1;
  return vector;
}

/** Every group of atoms with 1 to k − 1 employees that a viewer could work out from what they see. */
function disclosedSmallGroups(org: Organisation, k: number, shown: Figure[]): number[][] {
  const size = org.atoms.length;
  const basis = rowReduce(shown.map((f) => vectorOf(f, size)));
  const found: number[][] = [];
  for (let mask = 1; mask < 1 << size; mask++) {
    const members = org.atoms.map((_, i) => i).filter((i) => mask & (1 << i));
    const count = members.reduce((sum, i) => sum + org.atoms[i]!, 0);
    if (count < 1 || count >= k) continue;
    const vector = org.atoms.map((_, i) => ((mask & (1 << i)) !== 0 ? 1 : 0));
    if (inSpan(basis, vector)) found.push(members);
  }
  return found;
}

/** The same question asked the plain way: sums and differences of up to three shown figures. */
function smallSumsAndDifferences(org: Organisation, k: number, shown: Figure[]): string[] {
  const size = org.atoms.length;
  const vectors = shown.map((f) => vectorOf(f, size));
  const problems: string[] = [];
  const check = (terms: [number, number][]) => {
    const combined = new Array<number>(size).fill(0);
    for (const [index, sign] of terms)
      for (let j = 0; j < size; j++) combined[j]! += sign * vectors[index]![j]!;
    if (!combined.every((x) => x === 0 || x === 1)) return;
    const count = combined.reduce<number>((sum, x, j) => sum + x * org.atoms[j]!, 0);
    if (count >= 1 && count < k)
      problems.push(terms.map(([i, s]) => `${s > 0 ? '+' : '-'}${shown[i]!.cell.id}`).join(' '));
  };
  for (let a = 0; a < shown.length; a++) {
    check([[a, 1]]);
    for (let b = a + 1; b < shown.length; b++) {
      for (const sb of [1, -1]) {
        check([
          [a, 1],
          [b, sb],
        ]);
        check([
          [a, -1],
          [b, sb],
        ]);
        for (let c = b + 1; c < shown.length; c++)
          for (const sc of [1, -1])
            check([
              [a, 1],
              [b, sb],
              [c, sc],
            ]);
      }
    }
  }
  return problems;
}

/** Departments of teams; each manager sees their teams, the total over their teams, their departments and the organisation. */
function organisation(departments: number[][], owners: number[], withBands: number[][] | null): Organisation {
  const atoms: number[] = [];
  const figures: Figure[] = [];
  const relations: SumRelation[] = [];
  const teamAtoms: number[][] = [];
  const teamIds: string[] = [];
  const deptOf: number[] = [];
  const bandIds: string[][] = [];
  departments.forEach((teams, d) => {
    for (const size of teams) {
      const t = teamIds.length;
      const id = `team-${t}`;
      teamIds.push(id);
      deptOf.push(d);
      const bands = withBands?.[t];
      if (bands) {
        const ids = bands.map((count, b) => {
          atoms.push(count);
          figures.push({ cell: { id: `${id}-band-${b}`, count }, atoms: [atoms.length - 1] });
          return `${id}-band-${b}`;
        });
        teamAtoms.push(ids.map((_, b) => atoms.length - bands.length + b));
        bandIds.push(ids);
        relations.push({ total: id, parts: ids });
      } else {
        atoms.push(size);
        teamAtoms.push([atoms.length - 1]);
        bandIds.push([]);
      }
      figures.push({
        cell: { id, count: teamAtoms[t]!.reduce((s, a) => s + atoms[a]!, 0) },
        atoms: teamAtoms[t]!,
      });
    }
  });
  const figureOf = (id: string, members: number[]) => {
    const memberAtoms = members.flatMap((t) => teamAtoms[t]!);
    figures.push({ cell: { id, count: memberAtoms.reduce((s, a) => s + atoms[a]!, 0) }, atoms: memberAtoms });
    relations.push({ total: id, parts: members.map((t) => teamIds[t]!) });
  };
  for (let d = 0; d < departments.length; d++) {
    figureOf(
      `dept-${d}`,
      teamIds.map((_, t) => t).filter((t) => deptOf[t] === d),
    );
  }
  figures.push({
    cell: { id: 'org', count: atoms.reduce((a, b) => a + b, 0) },
    atoms: atoms.map((_, i) => i),
  });
  relations.push({ total: 'org', parts: departments.map((_, d) => `dept-${d}`) });
  const managers = [...new Set(owners)];
  const viewers: string[][] = [figures.map((f) => f.cell.id)];
  for (const m of managers) {
    const own = teamIds.map((_, t) => t).filter((t) => owners[t] === m);
    if (own.length > 1) figureOf(`combined-${m}`, own);
    viewers.push([
      'org',
      ...new Set(own.map((t) => `dept-${deptOf[t]}`)),
      ...own.map((t) => teamIds[t]!),
      ...own.flatMap((t) => bandIds[t]!),
      ...(own.length > 1 ? [`combined-${m}`] : []),
    ]);
  }
  return { atoms, figures, relations, viewers };
}

function assertNothingSmallRecoverable(org: Organisation, k: number): void {
  for (const visible of org.viewers) {
    const result = suppress({ k, cells: org.figures.map((f) => f.cell), relations: org.relations, visible });
    const shown = org.figures.filter((f) => isShown(result, f.cell.id));
    for (const f of shown) expect(f.cell.count === 0 || f.cell.count >= k).toBe(true);
    expect(smallSumsAndDifferences(org, k, shown)).toEqual([]);
    expect(disclosedSmallGroups(org, k, shown)).toEqual([]);
  }
}

describe('complementary suppression over random organisations', () => {
  it('never lets one viewer add or subtract shown team, department, organisation and own-teams totals into a group of 1 to k − 1', () => {
    const org = fc
      .array(fc.array(fc.integer({ min: 1, max: 15 }), { minLength: 1, maxLength: 4 }), {
        minLength: 1,
        maxLength: 3,
      })
      .chain((departments) => {
        const teamCount = departments.flat().length;
        return fc.record({
          departments: fc.constant(departments),
          owners: fc.array(fc.integer({ min: 0, max: 2 }), { minLength: teamCount, maxLength: teamCount }),
          k: fc.integer({ min: 2, max: 11 }),
        });
      });
    fc.assert(
      fc.property(org, ({ departments, owners, k }) => {
        assertNothingSmallRecoverable(organisation(departments, owners, null), k);
      }),
      { numRuns: Number(process.env.SUPPRESSION_RUNS ?? 150) },
    );
  });

  it('also holds when managers see the spread of their teams over risk bands', () => {
    const org = fc
      .array(fc.array(fc.constant(0), { minLength: 1, maxLength: 2 }), { minLength: 1, maxLength: 2 })
      .chain((departments) => {
        const teamCount = departments.flat().length;
        const band = fc.integer({ min: 0, max: 8 });
        return fc.record({
          departments: fc.constant(departments),
          bands: fc.array(
            fc.tuple(band, band, band).filter((b) => b[0] + b[1] + b[2] > 0),
            { minLength: teamCount, maxLength: teamCount },
          ),
          owners: fc.array(fc.integer({ min: 0, max: 1 }), { minLength: teamCount, maxLength: teamCount }),
          k: fc.integer({ min: 2, max: 8 }),
        });
      });
    fc.assert(
      fc.property(org, ({ departments, bands, owners, k }) => {
        assertNothingSmallRecoverable(organisation(departments, owners, bands), k);
      }),
      { numRuns: Number(process.env.SUPPRESSION_RUNS ?? 150) },
    );
  });
});
