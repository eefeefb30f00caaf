import type { BriefColumns, BriefModel } from '../../../backend/src/analysis/team-briefs';
import { generateQuillfernExport, QUILLFERN_WINDOW } from '../../../backend/src/demo/quillfern';
import { fitTree } from '../../../backend/src/modeling/fit';
import { buildTable } from '../../../backend/src/modeling/table';

/** Columns the demo model may use; the personal fields are left out as a privacy policy would block them. */
export const DEMO_FEATURES = [
  'Weekly Overtime Hours',
  'Avg Travel Minutes Between Visits',
  'Weekend Shifts per Month',
  'Months Since Pay Rise',
  'Training Days',
  'Engagement Score',
  'Role',
] as const;

/** The analyst's suggested action for each driver of the demo runs. */
export function demoAction(feature: string): string {
  return `Talk with the team about ${feature.toLowerCase()}.`;
}

export const DEMO_BLOCKED = ['Date of Birth', 'Sex', 'Ethnicity', 'Disability'];

/**
 * The invented Quillfern export as brief inputs, with an engine-trained tree: the outcome is a
 * resignation inside the window (the mapping of the demo), the features the allowed columns.
 */
export function demoBriefInputs(options: { rows?: number; seed?: number } = {}): {
  columns: BriefColumns;
  model: BriefModel;
  /** for assertions: every value that identifies a person in the export */
  identifiers: string[];
} {
  const data = generateQuillfernExport({ rows: options.rows ?? 600, seed: options.seed });
  const col = (name: string) => data.header.indexOf(name as never);
  const inWindow = (d: unknown) =>
    typeof d === 'string' && d >= QUILLFERN_WINDOW.start && d <= QUILLFERN_WINDOW.end;
  const rows = data.rows.filter((row) => {
    const start = row[col('Start Date')];
    const leaving = row[col('Leaving Date')];
    return (
      typeof start === 'string' &&
      start <= QUILLFERN_WINDOW.end &&
      (leaving === null || (leaving as string) >= QUILLFERN_WINDOW.start)
    );
  });
  const labels = rows.map((row) =>
    row[col('Leaving Reason')] === 'Resignation' && inWindow(row[col('Leaving Date')]) ? 1 : 0,
  );
  const features = DEMO_FEATURES.map((name) =>
    name === 'Role'
      ? { name, kind: 'categorical' as const, values: rows.map((row) => row[col(name)] as string | null) }
      : { name, kind: 'numeric' as const, values: rows.map((row) => row[col(name)] as number | null) },
  );
  const table = buildTable(features);
  const { tree } = fitTree(table, labels, { maxDepth: 4, minLeaf: 25, k: 5 });
  const text = (name: string) => rows.map((row) => row[col(name)] as string | null);
  return {
    columns: {
      labels,
      features,
      teams: text('Crew'),
      departments: text('Depot'),
      managerEmails: text('Line Manager Email'),
    },
    model: {
      tree,
      drivers: DEMO_FEATURES.map((feature) => ({
        feature,
        suggestedAction: demoAction(feature),
      })),
    },
    identifiers: rows.flatMap((row) => [
      String(row[col('Staff No')]),
      String(row[col('Full Name')]),
      String(row[col('Personal Email')]),
    ]),
  };
}
