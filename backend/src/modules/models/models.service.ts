import type {
  FeatureOptions,
  ModelRunCreated,
  ModelRunDetail,
  ModelRunRequest,
  ModelRunSettings,
  ModelRunStatus,
  ModelRunSummary,
  PublicationState,
} from '../../../../shared/models';
import { queueMail } from '../../jobs/mail.job';
import { queueModelRun, wakeModelRunWorker } from '../../jobs/model-run.job';
import { AppError, conflict, notFound } from '../../lib/errors';
import type { SessionUser } from '../auth/session-types';
import { currentPolicy, onPolicyChange } from '../policy/policy.service';
import { assertApprovedForModelling } from '../review/review.service';
import { setBriefSources } from '../teams/brief-sources';
import { findDatasetForModelling, keepTrainingInput, loadTrainingInput } from './dataset-input';
import { blockedReason, selectFeatures } from './feature-rules';
import {
  findModelRun,
  getModelRunForPublishing,
  insertModelRun,
  listModelRuns,
  type ModelRunRecord,
  markRunsNeedingReview,
  movePublication,
  privacyOfficerEmails,
  requestCancel,
  saveDriverAction,
  setPublicationState,
} from './models.repository';
import { toResultView } from './result-view';

let connected = false;

/**
 * Connects model runs to the rest once per process: runs made under an older policy version need
 * review when the policy changes, and publishing reads finished runs and moves their state.
 */
export function connectModelRuns(): void {
  if (connected) return;
  connected = true;
  onPolicyChange(async (change, manager) => {
    await markRunsNeedingReview(manager, change.current.version);
  });
  setBriefSources({
    loadRun: async (id) => {
      const run = await getModelRunForPublishing(id);
      if (run?.status !== 'done' || !run.tree) return null;
      return {
        id: run.id,
        datasetId: run.datasetId,
        publicationState: run.publicationState,
        policyVersion: run.policyVersion,
        tree: run.tree,
        drivers: run.drivers,
      };
    },
    setPublicationState: (id, state, comment) =>
      setPublicationState(id, state as PublicationState, comment ?? null),
  });
}

const actorOf = (user: SessionUser) => ({ id: user.id, email: user.email });

function summary(run: ModelRunRecord, auc: number | null): ModelRunSummary {
  return {
    id: run.id,
    datasetId: run.datasetId,
    datasetName: run.datasetName,
    status: run.status,
    progress: run.progress,
    phase: run.phase,
    settings: run.settings,
    policyVersion: run.policyVersion,
    needsReview: run.needsReview,
    publicationState: run.publicationState,
    publicationComment: run.publicationComment,
    createdBy: run.createdByEmail,
    createdAt: run.createdAt.toISOString(),
    finishedAt: run.finishedAt?.toISOString() ?? null,
    error: run.error,
    auc: auc !== null && Number.isFinite(auc) ? auc : null,
  };
}

export async function createModelRun(user: SessionUser, body: ModelRunRequest): Promise<ModelRunCreated> {
  const dataset = await findDatasetForModelling(body.datasetId);
  if (!dataset) throw notFound('The dataset');
  await assertApprovedForModelling(dataset.id);
  const policy = await currentPolicy();
  const input = await loadTrainingInput(body.datasetId);
  const { allowed, excluded, unknown } = selectFeatures(input.features, policy.blockedFields, {
    requested: body.features ?? null,
    profile: dataset.profile,
    blockedProxies: dataset.blockedProxies,
  });
  if (unknown.length > 0) {
    throw new AppError(
      'unknown_features',
      422,
      `The dataset has no feature column named ${unknown.map((f) => `"${f}"`).join(', ')}.`,
      { unknown },
    );
  }
  if (allowed.length === 0) {
    throw new AppError(
      'no_features',
      422,
      'No feature column is left for this run once blocked fields are removed: choose at least one allowed column.',
      { excluded },
    );
  }
  const effectiveMinLeaf = Math.max(body.minLeaf, policy.k);
  const raised = effectiveMinLeaf > body.minLeaf;
  const settings: ModelRunSettings = {
    criterion: body.criterion,
    maxDepth: body.maxDepth,
    minLeaf: body.minLeaf,
    effectiveMinLeaf,
    classWeight: body.classWeight,
    pruning: body.pruning,
    folds: body.folds,
    seed: body.seed,
    k: policy.k,
    requestedFeatures: body.features ?? null,
  };
  const id = await insertModelRun(
    {
      datasetId: dataset.id,
      datasetName: dataset.name,
      datasetVersion: dataset.version,
      dataWindow: dataset.dataWindow,
      settings,
      policyVersion: policy.version,
      k: policy.k,
      features: allowed,
      excludedFeatures: excluded,
      createdBy: actorOf(user),
    },
    (runId) => ({
      actor: actorOf(user),
      action: 'model.run',
      objectType: 'model_run',
      objectId: runId,
      details: {
        datasetId: dataset.id,
        policyVersion: policy.version,
        settings,
        features: allowed,
        excluded: excluded.map((e) => e.name),
      },
    }),
    queueModelRun,
  );
  keepTrainingInput(dataset.id, dataset.version, input);
  wakeModelRunWorker();
  const notices: string[] = [];
  if (raised) {
    notices.push(
      `Minimum leaf size raised from ${body.minLeaf} to ${effectiveMinLeaf}: the privacy policy's k is ${policy.k}, and no segment may be smaller.`,
    );
  }
  const blocked = excluded.filter((e) => e.reason !== 'not chosen for this run');
  if (blocked.length > 0) {
    notices.push(
      `Left out as blocked by the privacy policy: ${blocked.map((e) => `${e.name} (${e.reason})`).join('; ')}.`,
    );
  }
  return {
    id,
    status: 'queued',
    minLeaf: effectiveMinLeaf,
    minLeafRaisedToK: raised,
    notices,
    features: allowed,
    excludedFeatures: excluded,
  };
}

export async function featureOptions(datasetId: string): Promise<FeatureOptions> {
  const dataset = await findDatasetForModelling(datasetId);
  if (!dataset) throw notFound('The dataset');
  const policy = await currentPolicy();
  const input = await loadTrainingInput(datasetId);
  return {
    datasetId,
    k: policy.k,
    policyVersion: policy.version,
    features: input.features.map((f) => ({
      name: f.name,
      kind: f.kind,
      blocked:
        blockedReason(f, policy.blockedFields, dataset.profile) ?? dataset.blockedProxies[f.name] ?? null,
    })),
  };
}

async function requireRun(id: string): Promise<ModelRunRecord> {
  const run = await findModelRun(id);
  if (!run) throw notFound('The model run');
  return run;
}

export async function listRuns(filter: { datasetId?: string }): Promise<ModelRunSummary[]> {
  const runs = await listModelRuns(filter);
  return runs.map((run) => summary(run, run.listAuc));
}

export async function getRun(id: string): Promise<ModelRunDetail> {
  const run = await requireRun(id);
  // A policy made stricter since the run was trained applies to what is shown now.
  const k = Math.max(run.k, (await currentPolicy()).k);
  const result = run.status === 'done' && run.result ? toResultView(run.result, k, run.driverActions) : null;
  return {
    ...summary(run, result ? result.metrics.auc : null),
    k,
    features: run.features,
    excludedFeatures: run.excludedFeatures,
    dataWindow: run.dataWindow,
    result,
  };
}

export async function cancelRun(user: SessionUser, id: string): Promise<{ status: ModelRunStatus }> {
  const run = await requireRun(id);
  const status = await requestCancel(id, {
    actor: actorOf(user),
    action: 'model.cancel',
    objectType: 'model_run',
    objectId: id,
  });
  if (!status) throw conflict(`This run has already ended (${run.status}); there is nothing to cancel.`);
  return { status: status === 'cancelled' ? 'cancelled' : 'running' };
}

export async function setDriverAction(
  user: SessionUser,
  id: string,
  feature: string,
  text: string,
): Promise<{ feature: string; suggestedAction: string }> {
  const run = await requireRun(id);
  if (run.status !== 'done' || !run.result) {
    throw conflict('Suggested actions belong to the drivers of a finished run; wait for the run to finish.');
  }
  if (!run.result.importance.some((d) => d.feature === feature && d.importance > 0)) {
    throw notFound(`A driver named "${feature}" in this run`);
  }
  if (run.publicationState === 'requested' || run.publicationState === 'published') {
    throw conflict(
      'This run is with the privacy officers or published: its suggested actions can no longer change. Start a new run to change them.',
    );
  }
  await saveDriverAction(id, feature, text, {
    actor: actorOf(user),
    action: 'model.driver_action',
    objectType: 'model_run',
    objectId: id,
    details: { feature, length: text.length },
  });
  return { feature, suggestedAction: text };
}

export async function requestPublication(
  user: SessionUser,
  id: string,
  comment: string | undefined,
  appUrl: string,
): Promise<ModelRunSummary> {
  const run = await requireRun(id);
  if (run.status !== 'done') throw conflict('Only a finished run can be put forward for publication.');
  if (run.needsReview) {
    throw conflict(
      'The privacy policy changed after this run was trained: start a new run under the current policy and request publication for that one.',
    );
  }
  if (run.publicationState !== 'draft' && run.publicationState !== 'sent_back') {
    throw conflict(`This run's publication is already ${run.publicationState.replace('_', ' ')}.`);
  }
  const recipients = await privacyOfficerEmails();
  const moved = await movePublication(id, ['draft', 'sent_back'], 'requested', comment ?? null, {
    actor: actorOf(user),
    action: 'model.publication_request',
    objectType: 'model_run',
    objectId: id,
    details: { recipients: recipients.length },
  });
  if (!moved) throw conflict('This run was put forward for publication a moment ago.');
  if (recipients.length > 0) {
    await queueMail({
      to: recipients,
      subject: `Coppice: a model run asks for publication (${run.datasetName ?? 'dataset'})`,
      text: [
        `${user.name} (${user.email}) asks you to review a model run for publication.`,
        comment ? `\nTheir note: ${comment}\n` : '',
        `Open it here: ${appUrl}/models/${id}`,
        '',
        'Review the drivers, the suggested actions and what would be withheld before publishing team briefs.',
      ].join('\n'),
    });
  }
  return summary((await findModelRun(id)) as ModelRunRecord, null);
}

export async function sendBack(
  user: SessionUser,
  id: string,
  comment: string,
  appUrl: string,
): Promise<ModelRunSummary> {
  const run = await requireRun(id);
  const moved = await movePublication(id, ['requested'], 'sent_back', comment, {
    actor: actorOf(user),
    action: 'model.send_back',
    objectType: 'model_run',
    objectId: id,
    details: { comment },
  });
  if (!moved) throw conflict('Only a run whose publication was requested can be sent back.');
  await queueMail({
    to: [run.createdByEmail],
    subject: 'Coppice: your model run was sent back',
    text: `${user.name} sent your model run back before publication:\n\n${comment}\n\nOpen it here: ${appUrl}/models/${id}`,
  });
  return summary((await findModelRun(id)) as ModelRunRecord, null);
}
