/**
 * The fairness screen: for one blocked field, how attrition and the model's predicted risk differ
 * between its groups. Only aggregated figures, only for the privacy officer, never for training.
 *
 * Four-fifths rule (29 CFR 1607.4(D)): a group's rate below four fifths of the rate of the most
 * favourable group is generally regarded as evidence of adverse impact. The regulation speaks of
 * selection rates; for attrition we compare *retention* rates (1 − attrition rate), so a group that
 * stays less often than four fifths as much as the best-staying group is flagged.
 */
import { type Cell, type ColumnKind, toLevels } from './association';
import { type OrWithheld, showIf, suppress, WITHHELD } from './suppression';

export const FOUR_FIFTHS_RULE =
  'four-fifths rule (29 CFR 1607.4(D)), applied to retention rates (1 − attrition rate)';

export type FairnessGroup = {
  group: string;
  headcount: OrWithheld<number>;
  leavers: OrWithheld<number>;
  attritionRate: OrWithheld<number>;
  meanPredictedRisk: OrWithheld<number>;
  retentionRate: OrWithheld<number>;
  /** retention rate over the most favourable group's; null where that group retains nobody */
  retentionRatio: OrWithheld<number | null>;
  /** the most favourable group, against which the others are compared */
  reference: boolean;
  /** retention ratio under 4/5 */
  flagged: boolean;
  withheld: boolean;
};

export type FairnessReport = {
  field: string;
  rule: string;
  /** quantile bins used where the field is a number or a date; null for categories */
  bins: number | null;
  k: number;
  groups: FairnessGroup[];
};

export type FairnessInput = {
  field: string;
  /** the blocked field, one value per employee */
  values: readonly Cell[];
  /** whether each employee left (the outcome) */
  left: readonly boolean[];
  /** the model's predicted leaver probability for each employee */
  predicted: readonly number[];
  k: number;
  kind?: ColumnKind;
  bins?: number;
};

export function fairnessScreen(input: FairnessInput): FairnessReport {
  const { values, left, predicted, k } = input;
  if (left.length !== values.length || predicted.length !== values.length) {
    throw new Error('values, outcomes and predictions differ in length');
  }
  const levels = toLevels(values, { kind: input.kind, bins: input.bins });
  const stats = levels.labels.map((group) => ({ group, headcount: 0, leavers: 0, riskSum: 0 }));
  levels.codes.forEach((code, row) => {
    const s = stats[code]!;
    s.headcount++;
    if (left[row]) s.leavers++;
    s.riskSum += predicted[row]!;
  });
  const groups = stats.filter((s) => s.headcount > 0);

  // The privacy officer knows how many employees the dataset holds, so the groups sum to a shown total.
  const suppression = suppress({
    k,
    cells: [
      { id: 'all', count: values.length },
      ...groups.map((s, i) => ({ id: `group-${i}`, count: s.headcount })),
    ],
    relations: [{ total: 'all', parts: groups.map((_, i) => `group-${i}`) }],
  });
  const shown = groups.map((s, i) => ({ ...s, shown: showIf(suppression, [`group-${i}`], true) === true }));

  // Most favourable: highest retention among shown groups, compared exactly on the counts.
  let reference: (typeof shown)[number] | null = null;
  for (const s of shown) {
    if (!s.shown) continue;
    if (
      !reference ||
      (s.headcount - s.leavers) * reference.headcount >
        (reference.headcount - reference.leavers) * s.headcount
    ) {
      reference = s;
    }
  }

  return {
    field: input.field,
    rule: FOUR_FIFTHS_RULE,
    bins: levels.kind === 'categorical' ? null : levels.bins,
    k,
    groups: shown.map((s) => {
      if (!s.shown) {
        return {
          group: s.group,
          headcount: WITHHELD,
          leavers: WITHHELD,
          attritionRate: WITHHELD,
          meanPredictedRisk: WITHHELD,
          retentionRate: WITHHELD,
          retentionRatio: WITHHELD,
          reference: false,
          flagged: false,
          withheld: true,
        };
      }
      const retained = s.headcount - s.leavers;
      const refRetained = reference!.headcount - reference!.leavers;
      const ratio = refRetained === 0 ? null : retained / s.headcount / (refRetained / reference!.headcount);
      return {
        group: s.group,
        headcount: s.headcount,
        leavers: s.leavers,
        attritionRate: s.leavers / s.headcount,
        meanPredictedRisk: s.riskSum / s.headcount,
        retentionRate: retained / s.headcount,
        retentionRatio: ratio,
        reference: s === reference,
        // ratio < 4/5, in whole numbers so that exactly 0.8 is never flagged by rounding
        flagged: refRetained > 0 && 5 * retained * reference!.headcount < 4 * refRetained * s.headcount,
        withheld: false,
      };
    }),
  };
}
