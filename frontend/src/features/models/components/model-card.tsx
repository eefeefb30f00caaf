import type { ModelRunDetail } from '../../../../../shared/models';
import { CAUTION_TEXT } from '../../../components/caution';
import { formatPercent } from '../../../components/stat-figure';

const num = (x: number | undefined) => (x === undefined || !Number.isFinite(x) ? '–' : x.toFixed(3));

/** A one-page summary of a run for the file: what it was trained on, how, how well, and its limits. */
export function ModelCard({ run }: { run: ModelRunDetail }) {
  const r = run.result;
  const s = run.settings;
  return (
    <article className="model-card mx-auto max-w-3xl space-y-5 bg-white p-6 text-sm text-slate-900 print:p-0">
      <header>
        <h1 className="text-xl font-semibold">Model card: attrition tree</h1>
        <p className="text-slate-600">
          Run {run.id} · trained {new Date(run.createdAt).toLocaleString('en-GB')} by {run.createdBy}
        </p>
      </header>
      <section>
        <h2 className="font-semibold">Data</h2>
        <dl className="grid grid-cols-[12rem_1fr] gap-x-4 gap-y-1">
          <dt>Dataset</dt>
          <dd>{run.datasetName ?? run.datasetId}</dd>
          <dt>Data window</dt>
          <dd>
            {run.dataWindow
              ? `${run.dataWindow.start} to ${run.dataWindow.end}`
              : 'not given (a ready outcome column)'}
          </dd>
          <dt>Rows used</dt>
          <dd>
            {r
              ? `${r.rowCount.toLocaleString('en-GB')} employees, base rate ${formatPercent(r.baseRate)}`
              : '–'}
          </dd>
          <dt>Privacy policy</dt>
          <dd>
            version {run.policyVersion}, k = {run.k}
            {run.needsReview ? ' (the policy has changed since: needs review)' : ''}
          </dd>
        </dl>
      </section>
      <section>
        <h2 className="font-semibold">Features</h2>
        <p>Used: {run.features.join(', ') || '–'}.</p>
        <p>
          Not used:{' '}
          {run.excludedFeatures.length === 0
            ? 'none'
            : run.excludedFeatures.map((e) => `${e.name} (${e.reason})`).join('; ')}
          .
        </p>
      </section>
      <section>
        <h2 className="font-semibold">Settings</h2>
        <p>
          {s.criterion === 'gini' ? 'Gini impurity' : 'Entropy'}, maximum depth {s.maxDepth}, minimum leaf{' '}
          {s.effectiveMinLeaf}
          {s.effectiveMinLeaf > s.minLeaf ? ` (asked ${s.minLeaf}, raised to k)` : ''}, class weights{' '}
          {s.classWeight},{' '}
          {s.pruning === 'cv' ? 'cost-complexity pruning chosen by cross-validation' : 'no pruning'},{' '}
          {s.folds} folds, seed {s.seed}. The same settings and seed on the same dataset train the same tree.
        </p>
      </section>
      {r && (
        <section>
          <h2 className="font-semibold">How well it separates leavers from stayers</h2>
          <p>
            ROC AUC {num(r.metrics.auc)}
            {r.crossValidation
              ? ` (folds: ${num(r.crossValidation.metrics.auc.mean)} ± ${num(r.crossValidation.metrics.auc.sd)})`
              : ''}
            , recall {num(r.metrics.recall)} and precision {num(r.metrics.precision)} on leavers at the
            base-rate threshold, Brier score {num(r.metrics.brier)}; {r.pruning.leaves} segments. Figures from{' '}
            {r.metricsSource === 'cross-validation' ? 'cross-validation' : 'the training data'}.
          </p>
          <p>
            Main drivers:{' '}
            {r.drivers
              .slice(0, 5)
              .map((d) => `${d.feature} (${Math.round(d.importance * 100)}%)`)
              .join(', ') || 'none'}
            .
          </p>
        </section>
      )}
      <section>
        <h2 className="font-semibold">Limitations</h2>
        <ul className="list-disc pl-5">
          <li>A tree shows associations in past data, not causes; a driver is a question to look into.</li>
          <li>Segments and figures about fewer than {run.k} employees are withheld.</li>
          <li>
            Allowed fields can stand in for blocked ones (proxies); the privacy officer reviews them before
            publication.
          </li>
          <li>
            The figures hold for the data window above and may not hold for other periods or organisations.
          </li>
        </ul>
      </section>
      <section>
        <h2 className="font-semibold">Caution</h2>
        <p>{CAUTION_TEXT}</p>
      </section>
    </article>
  );
}
