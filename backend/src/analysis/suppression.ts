/**
 * Small-cell and complementary suppression: what one viewer may see of a set of counts.
 *
 * The figures are *cells*: counts of employees (a team's headcount, a department's, the employees
 * of a team in one risk band, a segment within a team, the total over a manager's teams). The
 * arithmetic between them is given as *relations* "total = sum of parts", the parts being disjoint
 * groups. A viewer sees some of the cells (their teams, their department, the organisation).
 *
 * Rules (US CMS cell size suppression policy, the test points of which are 0 shown, 1 to k − 1
 * withheld, k shown; Statistics Netherlands 2010 and Chu 1997 for the complementary part):
 * - primary: a visible cell counting 1 to k − 1 employees is withheld. A zero is shown: it exposes
 *   nobody, and a team with no employees does not exist in an export anyway.
 * - complementary: nothing the viewer can see may be combined to recover a count of 1 to k − 1.
 *   Cells the viewer cannot see are unknown to them, exactly like withheld ones. The viewer knows
 *   every linear combination of the shown cells and the relations (sums, differences, and any mix
 *   of them); so no small cell, and no union of the finest cells (those not broken down further),
 *   holding 1 to k − 1 employees may lie in that span. Until that holds, one more cell is withheld:
 *   near the group that could be worked out, preferring the cheapest cell (by `cost`, which
 *   defaults to the count) that hides it on its own.
 *   The search for unions is exhaustive within clusters of related cells, up to MAX_GROUPS_TRIED
 *   tries per cluster; the property tests check the result against every union exhaustively.
 *   Where a total has two breakdowns (risk bands and segments of one team), the second breakdown's
 *   cells count as "finest" too; unions mixing the two are then checked as if they were disjoint,
 *   which can only withhold more, never less.
 *
 * A rate is shown only where every count it is computed from is shown (`showIf`).
 */

export type Withheld = { withheld: true };
export const WITHHELD: Withheld = Object.freeze({ withheld: true as const });
export type OrWithheld<T> = T | Withheld;

export function isWithheldValue(value: unknown): value is Withheld {
  return typeof value === 'object' && value !== null && (value as { withheld?: unknown }).withheld === true;
}

export type CountCell = {
  id: string;
  /** number of employees, a non-negative integer */
  count: number;
  /** when a second cell must be withheld, the cheapest goes first; defaults to `count` */
  cost?: number;
};

export type SumRelation = { total: string; parts: readonly string[] };

export type SuppressionInput = {
  k: number;
  cells: readonly CountCell[];
  relations: readonly SumRelation[];
  /** the cells this viewer can see; all cells when left out */
  visible?: Iterable<string>;
};

export type Suppression = {
  k: number;
  /** visible cells the viewer gets as `{ withheld: true }` */
  withheld: ReadonlySet<string>;
  /** withheld because they count 1 to k − 1 */
  primary: ReadonlySet<string>;
  /** withheld so that the primary ones cannot be worked out */
  complementary: ReadonlySet<string>;
  visible: ReadonlySet<string>;
};

/** 1 ≤ count < k: a figure about too few employees to show (zero is shown). */
export function isSmallCount(count: number, k: number): boolean {
  return count >= 1 && count < k;
}

/** The count itself, or `{ withheld: true }` when it is about 1 to k − 1 employees. */
export function smallCellValue(count: number, k: number): OrWithheld<number> {
  return isSmallCount(count, k) ? WITHHELD : count;
}

/** Whether the viewer gets this cell's figure. */
export function isShown(result: Suppression, id: string): boolean {
  return result.visible.has(id) && !result.withheld.has(id);
}

/** The cell's count for this viewer, or `{ withheld: true }`. */
export function shownCount(result: Suppression, cell: CountCell): OrWithheld<number> {
  return isShown(result, cell.id) ? cell.count : WITHHELD;
}

/**
 * A value computed from some cells (a rate, the leavers of a team, a figure about its employees) is
 * shown only where every one of those cells is shown.
 */
export function showIf<T>(result: Suppression, ids: readonly string[], value: T): OrWithheld<T> {
  return ids.every((id) => isShown(result, id)) ? value : WITHHELD;
}

const EPSILON = 1e-9;

/**
 * What the viewer can work out: the linear span of the relations once the shown cells are
 * substituted. Rows are kept in reduced row echelon form over the unknown cells.
 */
class Knowledge {
  readonly rows: Float64Array[] = [];
  readonly pivots: number[] = [];

  constructor(readonly size: number) {}

  /** Reduces `vector` in place against the rows; returns whether anything is left. */
  reduce(vector: Float64Array): boolean {
    this.rows.forEach((row, r) => {
      const factor = vector[this.pivots[r]!]!;
      if (Math.abs(factor) > EPSILON) for (let j = 0; j < this.size; j++) vector[j]! -= factor * row[j]!;
    });
    return vector.some((x) => Math.abs(x) > EPSILON);
  }

  add(vector: Float64Array): void {
    if (!this.reduce(vector)) return;
    let pivot = 0;
    while (Math.abs(vector[pivot]!) <= EPSILON) pivot++;
    const scale = vector[pivot]!;
    for (let j = 0; j < this.size; j++) vector[j]! /= scale;
    for (const row of this.rows) {
      const factor = row[pivot]!;
      if (Math.abs(factor) > EPSILON) for (let j = 0; j < this.size; j++) row[j]! -= factor * vector[j]!;
    }
    this.rows.push(vector);
    this.pivots.push(pivot);
  }

  determines(vector: Float64Array): boolean {
    return !this.reduce(Float64Array.from(vector));
  }
}

export function suppress(input: SuppressionInput): Suppression {
  const { k, relations } = input;
  if (!Number.isInteger(k) || k < 1) throw new Error('k must be a positive integer');
  const cells = new Map<string, CountCell>();
  for (const cell of input.cells) {
    if (!Number.isInteger(cell.count) || cell.count < 0)
      throw new Error(`count of "${cell.id}" must be a whole number`);
    if (cells.has(cell.id)) throw new Error(`cell "${cell.id}" is given twice`);
    cells.set(cell.id, cell);
  }
  for (const relation of relations) {
    for (const id of [relation.total, ...relation.parts]) {
      if (!cells.has(id)) throw new Error(`relation refers to unknown cell "${id}"`);
    }
  }
  const visible = new Set(input.visible ?? cells.keys());
  const primary = new Set([...visible].filter((id) => isSmallCount(cells.get(id)!.count, k)));
  const withheld = new Set(primary);
  const relationsOf = new Map<string, number[]>();
  relations.forEach((relation, index) => {
    for (const id of [relation.total, ...relation.parts])
      relationsOf.set(id, [...(relationsOf.get(id) ?? []), index]);
  });
  const totals = new Set(relations.map((relation) => relation.total));
  // The finest groups: cells that are not broken down further. Every group the viewer could learn
  // the size of is a union of these.
  const leaves = [...cells.keys()].filter((id) => !totals.has(id));
  const isOpen = (id: string) => visible.has(id) && !withheld.has(id);
  const count = (ids: readonly string[]) => ids.reduce((sum, id) => sum + cells.get(id)!.count, 0);

  function findViolation(): string[] | null {
    const learned = learn(relations, isOpen);
    for (const id of cells.keys()) {
      if (
        !isOpen(id) &&
        isSmallCount(cells.get(id)!.count, k) &&
        learned.residual(new Map([[id, 1]])).size === 0
      ) {
        return [id];
      }
    }
    const candidates = leaves
      .filter((id) => !isOpen(id) && cells.get(id)!.count < k)
      .map((id) => ({ id, count: cells.get(id)!.count, residual: learned.residual(new Map([[id, 1]])) }))
      .filter((candidate) => candidate.residual.size > 0);
    return findSmallWorkedOutGroup(candidates, k);
  }

  const byCost = (a: string, b: string) => {
    const x = cells.get(a)!;
    const y = cells.get(b)!;
    return (x.cost ?? x.count) - (y.cost ?? y.count) || a.localeCompare(b);
  };

  /** Open cells in rings around `start`: those sharing a relation with it first, then the next ring. */
  function openCellsNear(start: readonly string[]): string[][] {
    const rings: string[][] = [];
    const seen = new Set(start);
    let frontier = [...start];
    while (frontier.length > 0) {
      const next: string[] = [];
      for (const id of frontier) {
        for (const index of relationsOf.get(id) ?? []) {
          const relation = relations[index]!;
          for (const other of [relation.total, ...relation.parts]) {
            if (seen.has(other)) continue;
            seen.add(other);
            next.push(other);
          }
        }
      }
      const ring = next.filter((id) => isOpen(id) && cells.get(id)!.count > 0).sort(byCost);
      if (ring.length > 0) rings.push(ring);
      frontier = next;
    }
    return rings;
  }

  function stillWorkedOut(group: readonly string[]): boolean {
    const learned = learn(relations, isOpen);
    return learned.residual(new Map(group.map((id) => [id, 1]))).size === 0;
  }

  /** Withholds the cheapest nearby open cell whose withholding alone hides the group again, else the cheapest nearby. */
  function withholdOneMore(group: readonly string[]): void {
    const rings = openCellsNear(group);
    if (rings.length === 0) throw new Error('no cell left to withhold');
    for (const ring of rings.slice(0, 2)) {
      for (const candidate of ring.slice(0, 16)) {
        withheld.add(candidate);
        if (!stillWorkedOut(group)) return;
        withheld.delete(candidate);
      }
    }
    withheld.add(rings[0]![0]!);
  }

  for (let round = 0; round <= cells.size; round++) {
    const group = findViolation();
    if (!group) {
      const complementary = new Set([...withheld].filter((id) => !primary.has(id)));
      return { k, withheld, primary, complementary, visible };
    }
    withholdOneMore(group);
  }
  throw new Error(`suppression did not settle (${count([...withheld])} employees withheld)`);
}

type Functional = Map<string, number>;

/**
 * What a viewer can work out from the open cells and the relations. `residual(f)` is what is left
 * of the linear combination `f` of cells after taking away everything the viewer knows: empty when
 * the viewer can compute `f`.
 */
function learn(
  relations: readonly SumRelation[],
  isOpen: (id: string) => boolean,
): { residual: (f: Functional) => Functional } {
  const relationsOf = new Map<string, number[]>();
  relations.forEach((relation, index) => {
    for (const id of [relation.total, ...relation.parts])
      relationsOf.set(id, [...(relationsOf.get(id) ?? []), index]);
  });
  // A relation made only of unknown cells, one of which ("own") appears in no other relation, tells
  // the viewer nothing more about the other cells: that one cell absorbs it. Such relations are set
  // aside, remembering the own cell as an expression of the others; this keeps the system small
  // (other teams' breakdowns and other departments drop away).
  const live = new Set(relations.map((_, index) => index));
  const expressions = new Map<string, Functional>();
  let pruned = true;
  while (pruned) {
    pruned = false;
    for (const index of live) {
      const relation = relations[index]!;
      const members = [relation.total, ...relation.parts];
      if (members.some(isOpen)) continue;
      const own = members.find((id) => relationsOf.get(id)!.filter((r) => live.has(r)).length === 1);
      if (own === undefined) continue;
      // total − Σ parts = 0, solved for `own`
      const sign = own === relation.total ? 1 : -1;
      const expression: Functional = new Map();
      for (const id of members) {
        if (id !== own)
          expression.set(id, (expression.get(id) ?? 0) - sign * (id === relation.total ? 1 : -1));
      }
      expressions.set(own, expression);
      live.delete(index);
      pruned = true;
    }
  }
  const unknown = [
    ...new Set([...live].flatMap((index) => [relations[index]!.total, ...relations[index]!.parts])),
  ].filter((id) => !isOpen(id));
  const unknownIndex = new Map(unknown.map((id, i) => [id, i]));
  const knowledge = new Knowledge(unknown.length);
  for (const index of live) {
    const relation = relations[index]!;
    const vector = new Float64Array(unknown.length);
    const total = unknownIndex.get(relation.total);
    if (total !== undefined) vector[total]! += 1;
    for (const part of relation.parts) {
      const i = unknownIndex.get(part);
      if (i !== undefined) vector[i]! -= 1;
    }
    knowledge.add(vector);
  }
  const residual = (functional: Functional): Functional => {
    const f = new Map(functional);
    for (let guard = 0; guard <= expressions.size; guard++) {
      const substituted = [...f.keys()].filter((id) => expressions.has(id) && Math.abs(f.get(id)!) > EPSILON);
      if (substituted.length === 0) break;
      for (const id of substituted) {
        const coefficient = f.get(id)!;
        f.delete(id);
        for (const [other, c] of expressions.get(id)!) f.set(other, (f.get(other) ?? 0) + coefficient * c);
      }
    }
    const vector = new Float64Array(unknown.length);
    const rest: Functional = new Map();
    for (const [id, coefficient] of f) {
      if (Math.abs(coefficient) <= EPSILON || isOpen(id)) continue;
      const index = unknownIndex.get(id);
      if (index === undefined) rest.set(id, coefficient);
      else vector[index] = coefficient;
    }
    knowledge.reduce(vector);
    vector.forEach((x, i) => {
      if (Math.abs(x) > EPSILON) rest.set(unknown[i]!, x);
    });
    return rest;
  };
  return { residual };
}

type Candidate = { id: string; count: number; residual: Functional };

/** Bound on the groups tried per cluster of related unknown cells (real briefs stay far below). */
const MAX_GROUPS_TRIED = 200_000;

/**
 * A set of unknown leaf cells whose total the viewer can work out (their residuals cancel) and which
 * holds 1 to k − 1 employees, or null. Cells whose residuals share nothing cannot cancel each other,
 * so the search runs within clusters of cells linked by shared residual terms.
 */
function findSmallWorkedOutGroup(candidates: readonly Candidate[], k: number): string[] | null {
  const parent = candidates.map((_, i) => i);
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i]!)));
  const owner = new Map<string, number>();
  candidates.forEach((candidate, i) => {
    for (const key of candidate.residual.keys()) {
      const j = owner.get(key);
      if (j === undefined) owner.set(key, i);
      else parent[find(i)] = find(j);
    }
  });
  const clusters = new Map<number, Candidate[]>();
  candidates.forEach((candidate, i) => {
    const root = find(i);
    clusters.set(root, [...(clusters.get(root) ?? []), candidate]);
  });
  for (const cluster of clusters.values()) {
    if (cluster.length < 2) continue;
    const members = [...cluster].sort((a, b) => b.count - a.count);
    const sum = new Map<string, number>();
    let nonZero = 0;
    let tried = 0;
    const chosen: string[] = [];
    const apply = (residual: Functional, sign: number) => {
      for (const [key, value] of residual) {
        const before = sum.get(key) ?? 0;
        const after = before + sign * value;
        if (Math.abs(before) > 1e-7) nonZero--;
        if (Math.abs(after) > 1e-7) nonZero++;
        sum.set(key, after);
      }
    };
    const search = (start: number, total: number): boolean => {
      for (let i = start; i < members.length; i++) {
        const member = members[i]!;
        if (total + member.count >= k || ++tried > MAX_GROUPS_TRIED) continue;
        apply(member.residual, 1);
        chosen.push(member.id);
        const found = (nonZero === 0 && total + member.count >= 1) || search(i + 1, total + member.count);
        if (found) return true;
        chosen.pop();
        apply(member.residual, -1);
      }
      return false;
    };
    if (search(0, 0)) return chosen;
  }
  return null;
}
