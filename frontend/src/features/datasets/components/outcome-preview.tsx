import type { OutcomePreview } from '../../../../../shared/datasets';
import { StatFigure } from '../../../components/stat-figure';

const percent = (value: number) => `${value.toFixed(1)}%`;

/** The counts a mapping gives: headcount, leavers, attrition rate and the rows left out, with reasons. */
export function OutcomePreviewPanel({ preview }: { preview: OutcomePreview }) {
  const exitDates = preview.kind === 'exit-dates';
  return (
    <div className="space-y-3">
      <div className="grid grid-cols-2 gap-3 lg:grid-cols-3">
        {exitDates && <StatFigure label="Headcount at window start" value={preview.headcountStart} />}
        {exitDates && <StatFigure label="Headcount at window end" value={preview.headcountEnd} />}
        <StatFigure
          label={exitDates ? 'Voluntary leavers' : 'Leavers (positive values)'}
          value={preview.leaversVoluntary}
        />
        {exitDates && <StatFigure label="Other leavers" value={preview.leaversOther} />}
        <StatFigure
          label="Attrition rate"
          value={preview.attritionRate}
          format={percent}
          hint={
            exitDates
              ? `all leavers ÷ average headcount; voluntary only: ${preview.voluntaryAttritionRate === null ? '–' : percent(preview.voluntaryAttritionRate)}`
              : 'positives ÷ rows with a value'
          }
        />
        <StatFigure label="Rows with an outcome" value={preview.included} />
      </div>
      {preview.excluded.count > 0 && (
        <div className="rounded-md border border-sand-200 bg-sand-50 px-4 py-3 text-sm">
          <p className="font-medium text-slate-800">
            {preview.excluded.count.toLocaleString('en-GB')} row(s) left out of the outcome
          </p>
          <ul className="mt-1 list-disc pl-5 text-slate-700">
            {preview.excluded.reasons.map((r) => (
              <li key={r.reason}>
                {r.reason}: {r.count.toLocaleString('en-GB')}
              </li>
            ))}
          </ul>
          <p className="mt-1 text-xs text-slate-500">
            Rows: {preview.excluded.rows.map((r) => r.row).join(', ')}
            {preview.excluded.count > preview.excluded.rows.length ? ', …' : ''}
          </p>
        </div>
      )}
    </div>
  );
}
