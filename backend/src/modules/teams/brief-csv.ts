import { type OrWithheld, RISK_BANDS, type TeamBriefResponse } from '../../../../shared/briefs';
import { type CsvValue, toCsv } from '../../analysis/safe-csv';

/** The brief's aggregated figures as CSV (formula-safe cells), with the caution. */
export function briefToCsv(brief: TeamBriefResponse): string {
  const withheld = `withheld: fewer than ${brief.k} employees`;
  const value = (v: OrWithheld<number>, format?: (x: number) => CsvValue): CsvValue =>
    typeof v === 'number' ? (format ? format(v) : v) : withheld;
  const percent = (x: number) => Number((x * 100).toFixed(1));
  const rows: CsvValue[][] = [
    ['team', 'name', brief.team.name, ''],
    ['team', 'department', brief.team.department ?? '', ''],
    ['brief', 'published', brief.publishedAt, ''],
    ['brief', 'k (minimum group size)', brief.k, ''],
  ];
  if (brief.withheld) {
    rows.push(['team', 'brief', brief.message, '']);
  } else {
    if (brief.window) rows.push(['brief', 'data window', `${brief.window.start} to ${brief.window.end}`, '']);
    const groups = [
      ['team', brief.figures.team],
      ...(brief.figures.department ? [['department', brief.figures.department] as const] : []),
      ['organisation', brief.figures.organisation],
    ] as const;
    for (const [section, figures] of groups) {
      rows.push([section, 'headcount', value(figures.headcount), '']);
      rows.push([section, 'leavers', value(figures.leavers), '']);
      rows.push([section, 'attrition rate (%)', value(figures.attritionRate, percent), '']);
    }
    rows.push(['team', 'expected leaver share (%)', brief.expectedLeaverShare.team, '']);
    rows.push(['organisation', 'expected leaver share (%)', brief.expectedLeaverShare.organisation, '']);
    for (const band of RISK_BANDS) {
      const entry = brief.riskBands.bands.find((b) => b.band === band);
      if (entry) rows.push(['risk band', band, value(entry.employees), '']);
    }
    rows.push(['risk band', 'rule', brief.riskBands.rule, '']);
    for (const driver of brief.drivers) {
      rows.push(['driver', driver.feature, driver.sentence, driver.suggestedAction ?? '']);
    }
    for (const segment of brief.segments) {
      rows.push([
        'segment',
        segment.rule,
        segment.employees,
        `leaver share across the organisation: ${segment.leaverShare}%`,
      ]);
    }
  }
  rows.push(['caution', '', brief.caution, '']);
  return toCsv(['section', 'item', 'value', 'detail'], rows);
}
