/**
 * Team briefs from a published model run: every team's figures, risk bands, drivers and segments,
 * as the team's manager may see them. Pure computation: no I/O.
 *
 * Each manager is one viewer. What one manager sees (their teams, the departments of those teams
 * and the organisation) goes through one call of `suppress`, so nothing they can add up or
 * subtract recovers a group of 1 to k − 1 employees. The groups are modelled exactly: for the
 * viewer's own teams the finest groups are "segment × left or stayed" (a risk band is a union of
 * segments, because a row's expected leaver share is its segment's share), for everyone else
 * "team × left or stayed".
 */
import {
  BRIEF_CAUTION,
  type BriefDriver,
  type BriefSegment,
  type GroupFigures,
  RISK_BANDS,
  type RiskBandName,
  type TeamBrief,
  type TeamBriefResponse,
  type TeamRef,
} from '../../../shared/briefs';
import { isInternal, type TreeNode } from '../../../shared/tree';
import { aggregateAttributions, describeSegments, pathAttributions } from '../modeling/explain';
import { buildTable, type ColumnInput } from '../modeling/table';
import { assignSegments } from '../modeling/tree-json';
import {
  type CountCell,
  isShown,
  type OrWithheld,
  type SumRelation,
  type Suppression,
  showIf,
  suppress,
} from './suppression';

export type BriefColumns = {
  /** 1 = left in the window */
  labels: ArrayLike<number>;
  features: readonly {
    name: string;
    kind: 'numeric' | 'categorical';
    values: ArrayLike<number | string | null>;
  }[];
  teams: readonly (string | null)[];
  departments: readonly (string | null)[] | null;
  managerEmails: readonly (string | null)[] | null;
};

export type BriefModel = {
  tree: TreeNode;
  /** the analyst's drivers of the run, with their suggested actions */
  drivers: readonly { feature: string; suggestedAction?: string | null }[];
};

export type BriefSettings = {
  k: number;
  blockedFields: readonly string[];
  window: { start: string; end: string } | null;
  publishedAt: string;
  /** the id a team gets in the publication (stored briefs use generated ids) */
  teamId?: (name: string, index: number) => string;
};

export type ComputedTeam = {
  id: string;
  name: string;
  department: string | null;
  /** lower-cased; null when the team has no manager e-mail */
  managerEmail: string | null;
  withheld: boolean;
  /** as the manager sees it: null when withheld */
  headcount: number | null;
  attritionRate: OrWithheld<number> | null;
  organisationRate: OrWithheld<number> | null;
  brief: TeamBriefResponse;
};

/** Shown drivers per team (the largest differences from the organisation). */
export const DRIVERS_PER_BRIEF = 5;

/** Risk bands relative to the organisation's attrition rate (a product choice, stated in every brief). */
const LOW_BELOW = 0.75;
const HIGH_FROM = 1.5;

/** The risk band of an expected leaver share, given the organisation's attrition rate. */
export function riskBandOf(share: number, organisationRate: number): RiskBandName {
  if (Number.isNaN(share)) return 'medium';
  if (share < LOW_BELOW * organisationRate) return 'low';
  return share >= HIGH_FROM * organisationRate ? 'high' : 'medium';
}

export function withheldMessage(k: number): string {
  return `withheld: fewer than ${k} employees. This team is too small for a brief; nothing about it is shown.`;
}

type Team = {
  index: number;
  name: string;
  rows: number[];
  department: string | null;
  managerEmail: string | null;
  leavers: number;
};

function majority(values: readonly (string | null)[], rows: readonly number[], lower = false): string | null {
  const counts = new Map<string, number>();
  for (const r of rows) {
    const raw = values[r];
    if (raw === null || raw === undefined) continue;
    const v = lower ? raw.trim().toLowerCase() : raw.trim();
    if (v !== '') counts.set(v, (counts.get(v) ?? 0) + 1);
  }
  let best: string | null = null;
  let bestCount = 0;
  for (const [value, count] of [...counts].sort((a, b) => a[0].localeCompare(b[0]))) {
    if (count > bestCount) {
      best = value;
      bestCount = count;
    }
  }
  return best;
}

/** The columns a tree splits on. */
export function treeFeatures(tree: TreeNode): string[] {
  const found = new Set<string>();
  const walk = (node: TreeNode) => {
    if (!isInternal(node)) return;
    found.add(node.split.feature);
    walk(node.children[0]);
    walk(node.children[1]);
  };
  walk(tree);
  return [...found];
}

const round = (x: number, digits = 0) => Number(x.toFixed(digits));

function describeDriver(
  feature: string,
  difference: number,
): Pick<BriefDriver, 'direction' | 'points' | 'sentence'> {
  const points = Math.round(Math.abs(difference) * 100);
  if (points === 0) {
    return {
      direction: 'about the same',
      points: 0,
      sentence: `${feature} weighs on the expected leaver share of this team about as much as across the organisation.`,
    };
  }
  const unit = points === 1 ? 'point' : 'points';
  return difference > 0
    ? {
        direction: 'raises',
        points,
        sentence: `${feature} raises the expected leaver share of this team by about ${points} ${unit} over the organisation.`,
      }
    : {
        direction: 'lowers',
        points,
        sentence: `${feature} lowers the expected leaver share of this team by about ${points} ${unit} below the organisation.`,
      };
}

/** Computes every team's brief as its manager sees it. */
export function computeTeamBriefs(
  columns: BriefColumns,
  model: BriefModel,
  settings: BriefSettings,
): ComputedTeam[] {
  const { k } = settings;
  const rowCount = columns.labels.length;
  if (columns.teams.length !== rowCount) throw new Error('One team value per row is needed');
  const label = Uint8Array.from({ length: rowCount }, (_, r) => (columns.labels[r] ? 1 : 0));
  const blocked = new Set(settings.blockedFields);
  const used = treeFeatures(model.tree);
  const blockedInTree = used.filter((f) => blocked.has(f));
  if (blockedInTree.length > 0) {
    throw new Error(
      `The model splits on blocked fields (${blockedInTree.join(', ')}); it cannot be published`,
    );
  }

  // The table holds only what the tree splits on.
  const inputs: ColumnInput[] = used.map((name) => {
    const feature = columns.features.find((f) => f.name === name);
    if (!feature) throw new Error(`The dataset has no column "${name}" that the model splits on`);
    return feature.kind === 'numeric'
      ? { name, kind: 'numeric', values: feature.values as ArrayLike<number | null> }
      : { name, kind: 'categorical', values: feature.values as ArrayLike<string | null> };
  });
  const table =
    inputs.length > 0
      ? buildTable(inputs)
      : { rowCount, columns: [] as ReturnType<typeof buildTable>['columns'] };
  const attributions = pathAttributions(model.tree, table);
  const segmentOf = assignSegments(model.tree, table);
  const segmentInfo = new Map(describeSegments(model.tree, table).map((s) => [s.id, s]));

  const orgLeavers = label.reduce((a, b) => a + b, 0);
  const orgRate = rowCount > 0 ? orgLeavers / rowCount : 0;
  const lowCut = LOW_BELOW * orgRate;
  const highCut = HIGH_FROM * orgRate;
  const bandOfShare = (p: number) => riskBandOf(p, orgRate);
  const bandOfSegment = new Map<string, RiskBandName>();
  for (let r = 0; r < rowCount; r++) {
    if (!bandOfSegment.has(segmentOf[r]!))
      bandOfSegment.set(segmentOf[r]!, bandOfShare(attributions.prediction[r]!));
  }
  const pct = (x: number) => `${round(x * 100)}%`;
  const bandRule = `Employees are put into bands by the model's expected leaver share of their segment: low below ${pct(lowCut)}, medium from ${pct(lowCut)} to below ${pct(highCut)}, high from ${pct(highCut)} (${LOW_BELOW} and ${HIGH_FROM} times the organisation's attrition rate of ${pct(orgRate)}).`;

  // Teams, their departments and managers.
  const teamIndex = new Map<string, number>();
  const teams: Team[] = [];
  const unassigned: number[] = [];
  for (let r = 0; r < rowCount; r++) {
    const name = columns.teams[r]?.trim();
    if (!name) {
      unassigned.push(r);
      continue;
    }
    let t = teamIndex.get(name);
    if (t === undefined) {
      t = teams.length;
      teamIndex.set(name, t);
      teams.push({ index: t, name, rows: [], department: null, managerEmail: null, leavers: 0 });
    }
    teams[t]!.rows.push(r);
    teams[t]!.leavers += label[r]!;
  }
  for (const team of teams) {
    team.department = columns.departments ? majority(columns.departments, team.rows) : null;
    team.managerEmail = columns.managerEmails ? majority(columns.managerEmails, team.rows, true) : null;
  }
  const departments = new Map<string, Team[]>();
  for (const team of teams) {
    if (team.department !== null)
      departments.set(team.department, [...(departments.get(team.department) ?? []), team]);
  }
  const deptIds = new Map([...departments.keys()].map((name, i) => [name, `d${i}`]));
  const unassignedLeavers = unassigned.reduce((s, r) => s + label[r]!, 0);

  /** The cells and relations one viewer's suppression works on. */
  function cellsFor(own: ReadonlySet<number>, detail: ReadonlyMap<number, number>) {
    const cells: CountCell[] = [];
    const relations: SumRelation[] = [];
    const count = new Map<string, number>();
    const cell = (id: string, value: number, cost: number) => {
      cells.push({ id, count: value, cost });
      count.set(id, value);
      return id;
    };
    // Groups known to be empty are left out of sums: treating them as known only widens what the
    // viewer is assumed to know, so suppression can only withhold more.
    const relate = (total: string, parts: string[]) => {
      const nonEmpty = parts.filter((p) => count.get(p)! > 0);
      if (nonEmpty.length > 0) relations.push({ total, parts: nonEmpty });
    };
    const visible: string[] = [];
    const teamCells = (team: Team) => {
      const t = `t${team.index}`;
      const stayers = team.rows.length - team.leavers;
      if (!own.has(team.index)) {
        return { leavers: cell(`${t}:l`, team.leavers, 50_000), stayers: cell(`${t}:s`, stayers, 50_000) };
      }
      const atoms = new Map<string, [number, number]>();
      for (const r of team.rows) {
        const entry = atoms.get(segmentOf[r]!) ?? [0, 0];
        entry[label[r]!]!++;
        atoms.set(segmentOf[r]!, entry);
      }
      const leaverAtoms: string[] = [];
      const stayerAtoms: string[] = [];
      const bandParts = new Map<RiskBandName, string[]>(RISK_BANDS.map((b) => [b, []]));
      for (const [segment, [stay, left]] of [...atoms].sort((a, b) => a[0].localeCompare(b[0]))) {
        const s = cell(`${t}:seg:${segment}:s`, stay, 1);
        const l = cell(`${t}:seg:${segment}:l`, left, 1);
        stayerAtoms.push(s);
        leaverAtoms.push(l);
        const seg = cell(`${t}:seg:${segment}`, stay + left, 10 + stay + left);
        relate(seg, [s, l]);
        if (stay + left >= k && segmentInfo.has(segment) && detail.get(team.index)! >= 2) visible.push(seg);
        bandParts.get(bandOfSegment.get(segment) ?? 'medium')!.push(seg);
      }
      const bands = RISK_BANDS.map((band) => {
        const parts = bandParts.get(band)!;
        const id = cell(
          `${t}:band:${band}`,
          parts.reduce((s, p) => s + count.get(p)!, 0),
          1000 + parts.length,
        );
        relate(id, parts);
        if (detail.get(team.index)! >= 1) visible.push(id);
        return id;
      });
      const n = cell(`${t}:n`, team.rows.length, 1_000_000);
      relate(n, bands);
      const leavers = cell(`${t}:l`, team.leavers, 50_000);
      relate(leavers, leaverAtoms);
      const stayersCell = cell(`${t}:s`, stayers, 50_000);
      relate(stayersCell, stayerAtoms);
      visible.push(n, leavers);
      return { leavers, stayers: stayersCell };
    };
    const orgLeaverParts: string[] = [];
    const orgStayerParts: string[] = [];
    const ownDepartments = new Set([...own].map((t) => teams[t]!.department));
    for (const [name, members] of departments) {
      const d = deptIds.get(name)!;
      const parts = members.map(teamCells);
      const leavers = members.reduce((s, t) => s + t.leavers, 0);
      const size = members.reduce((s, t) => s + t.rows.length, 0);
      const dl = cell(`${d}:l`, leavers, 5000);
      relate(
        dl,
        parts.map((p) => p.leavers),
      );
      const ds = cell(`${d}:s`, size - leavers, 5000);
      relate(
        ds,
        parts.map((p) => p.stayers),
      );
      const dn = cell(`${d}:n`, size, 6000);
      relate(dn, [dl, ds]);
      orgLeaverParts.push(dl);
      orgStayerParts.push(ds);
      if (ownDepartments.has(name)) visible.push(dn, dl);
    }
    for (const team of teams.filter((t) => t.department === null)) {
      const parts = teamCells(team);
      orgLeaverParts.push(parts.leavers);
      orgStayerParts.push(parts.stayers);
    }
    orgLeaverParts.push(cell('u:l', unassignedLeavers, 50_000));
    orgStayerParts.push(cell('u:s', unassigned.length - unassignedLeavers, 50_000));
    const ol = cell('org:l', orgLeavers, 20_000);
    relate(ol, orgLeaverParts);
    const os = cell('org:s', rowCount - orgLeavers, 20_000);
    relate(os, orgStayerParts);
    const on = cell('org:n', rowCount, 21_000);
    relate(on, [ol, os]);
    visible.push(on, ol);
    return { cells, relations, visible, count };
  }

  const figures = (result: Suppression, count: Map<string, number>, prefix: string): GroupFigures => {
    const n = count.get(`${prefix}:n`)!;
    const l = count.get(`${prefix}:l`)!;
    return {
      headcount: showIf(result, [`${prefix}:n`], n),
      leavers: showIf(result, [`${prefix}:l`], l),
      attritionRate: showIf(result, [`${prefix}:n`, `${prefix}:l`], n > 0 ? l / n : 0),
    };
  };

  const actionOf = new Map(model.drivers.map((d) => [d.feature, d.suggestedAction ?? null]));
  const idOf = (team: Team) => settings.teamId?.(team.name, team.index) ?? `team-${team.index}`;
  const refOf = (team: Team): TeamRef => ({ id: idOf(team), name: team.name, department: team.department });

  // One viewer per manager; a team without a manager is its own viewer.
  const viewers = new Map<string, number[]>();
  for (const team of teams) {
    const key = team.managerEmail ?? `\u0000team:${team.index}`;
    viewers.set(key, [...(viewers.get(key) ?? []), team.index]);
  }

  const out: ComputedTeam[] = new Array(teams.length);
  for (const ownList of viewers.values()) {
    const own = new Set(ownList);
    // Full detail first. Where that would cost a team of at least k its headcount (complementary
    // suppression picks one cell at a time), show that team with less detail: no segments, then
    // no risk bands, and suppress again.
    const detail = new Map(ownList.map((t) => [t, 2]));
    let cellsAndRelations = cellsFor(own, detail);
    let result = suppress({ k, ...cellsAndRelations });
    for (let attempt = 0; attempt < 2; attempt++) {
      const lost = ownList.filter((t) => teams[t]!.rows.length >= k && !isShown(result, `t${t}:n`));
      if (lost.length === 0) break;
      for (const t of lost) detail.set(t, Math.max(0, detail.get(t)! - 1));
      cellsAndRelations = cellsFor(own, detail);
      result = suppress({ k, ...cellsAndRelations });
    }
    const { count } = cellsAndRelations;
    const organisation = figures(result, count, 'org');
    for (const t of ownList) {
      const team = teams[t]!;
      const ref = refOf(team);
      if (!isShown(result, `t${t}:n`)) {
        out[t] = {
          id: ref.id,
          name: team.name,
          department: team.department,
          managerEmail: team.managerEmail,
          withheld: true,
          headcount: null,
          attritionRate: null,
          organisationRate: null,
          brief: {
            withheld: true,
            team: ref,
            k,
            publishedAt: settings.publishedAt,
            message: withheldMessage(k),
            caution: BRIEF_CAUTION,
          },
        };
        continue;
      }
      const teamFigures = figures(result, count, `t${t}`);
      const department =
        team.department === null
          ? null
          : { name: team.department, ...figures(result, count, deptIds.get(team.department)!) };
      const group = aggregateAttributions(model.tree, table, team.rows, { k, attributions });
      const drivers: BriefDriver[] = group.withheld
        ? []
        : group.drivers
            .filter((d) => !blocked.has(d.feature))
            .slice(0, DRIVERS_PER_BRIEF)
            .map((d) => ({
              feature: d.feature,
              ...describeDriver(d.feature, d.difference),
              suggestedAction: actionOf.get(d.feature) ?? null,
            }));
      const segments: BriefSegment[] = [...segmentInfo.values()]
        .filter((s) => isShown(result, `t${t}:seg:${s.id}`))
        .map((s) => ({
          id: s.id,
          rule: s.rule,
          employees: count.get(`t${t}:seg:${s.id}`)!,
          leaverShare: round(s.share * 100),
        }))
        .sort((a, b) => b.employees - a.employees || a.id.localeCompare(b.id));
      const brief: TeamBrief = {
        withheld: false,
        team: ref,
        k,
        window: settings.window,
        publishedAt: settings.publishedAt,
        figures: { team: teamFigures, department, organisation },
        expectedLeaverShare: group.withheld
          ? { team: 0, organisation: round(orgRate * 100) }
          : {
              team: round(group.groupPrediction * 100),
              organisation: round(group.organisationPrediction * 100),
            },
        riskBands: {
          rule: bandRule,
          bands: RISK_BANDS.map((band) => ({
            band,
            employees: showIf(result, [`t${t}:band:${band}`], count.get(`t${t}:band:${band}`)!),
          })),
        },
        drivers,
        segments,
        caution: BRIEF_CAUTION,
      };
      out[t] = {
        id: ref.id,
        name: team.name,
        department: team.department,
        managerEmail: team.managerEmail,
        withheld: false,
        headcount: team.rows.length,
        attritionRate: teamFigures.attritionRate,
        organisationRate: organisation.attritionRate,
        brief,
      };
    }
  }
  return out;
}
