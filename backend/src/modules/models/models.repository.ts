import type { EntityManager } from 'typeorm';
import type {
  ExcludedFeature,
  ModelDriver,
  ModelRunPhase,
  ModelRunSettings,
  ModelRunStatus,
  PublicationState,
} from '../../../../shared/models';
import type { TreeNode } from '../../../../shared/tree';
import { ModelRun } from '../../entities/model-run.entity';
import { User } from '../../entities/user.entity';
import { db } from '../../lib/db';
import type { Segment } from '../../modeling/explain';
import { type AuditEntry, recordAudit } from '../audit/audit.repository';
import { buildDrivers, type StoredResult } from './result-view';

/** A model run as the services read it: plain data, the stored result typed. */
export type ModelRunRecord = Omit<ModelRun, 'result'> & { result: StoredResult | null };

function toRecord(run: ModelRun): ModelRunRecord {
  return { ...run, result: run.result as unknown as StoredResult | null };
}

export type NewModelRun = {
  datasetId: string;
  datasetName: string | null;
  datasetVersion: string | null;
  dataWindow: { start: string; end: string } | null;
  settings: ModelRunSettings;
  policyVersion: number;
  k: number;
  features: string[];
  excludedFeatures: ExcludedFeature[];
  createdBy: { id: string | null; email: string };
};

/**
 * Stores a queued run, its audit line and its job together: `enqueue` sends the job inside the
 * same transaction, so a worker never sees a job before its run exists.
 */
export async function insertModelRun(
  input: NewModelRun,
  audit: (id: string) => AuditEntry,
  enqueue: (id: string, manager: EntityManager) => Promise<void>,
): Promise<string> {
  return db().transaction(async (manager) => {
    const inserted = await manager.insert(ModelRun, {
      datasetId: input.datasetId,
      datasetName: input.datasetName,
      datasetVersion: input.datasetVersion,
      dataWindow: input.dataWindow,
      status: 'queued',
      progress: 0,
      phase: null,
      settings: input.settings,
      policyVersion: input.policyVersion,
      k: input.k,
      features: input.features,
      excludedFeatures: input.excludedFeatures,
      error: null,
      createdById: input.createdBy.id,
      createdByEmail: input.createdBy.email,
    });
    const id = String(inserted.identifiers[0].id);
    await recordAudit(audit(id), manager);
    await enqueue(id, manager);
    return id;
  });
}

export async function findModelRun(id: string): Promise<ModelRunRecord | null> {
  const run = await db()
    .getRepository(ModelRun)
    .createQueryBuilder('r')
    .addSelect('r.result')
    .where('r.id = :id', { id })
    .getOne();
  return run ? toRecord({ ...run, result: run.result ?? null } as ModelRun) : null;
}

/** Runs newest first, without their results (list pages need the headline only). */
export async function listModelRuns(
  filter: { datasetId?: string } = {},
): Promise<(ModelRunRecord & { listAuc: number | null })[]> {
  const rows = await db()
    .getRepository(ModelRun)
    .createQueryBuilder('r')
    .select('r')
    .addSelect(`(r.result -> 'crossValidation' -> 'metrics' -> 'auc' ->> 'mean')::float8`, 'cv_auc')
    .addSelect(`(r.result -> 'inSample' -> 'metrics' ->> 'auc')::float8`, 'in_sample_auc')
    .where(filter.datasetId ? 'r.dataset_id = :datasetId' : 'TRUE', { datasetId: filter.datasetId })
    .orderBy('r.created_at', 'DESC')
    .limit(500)
    .getRawAndEntities();
  return rows.entities.map((run, i) => {
    const raw = rows.raw[i] as { cv_auc: number | null; in_sample_auc: number | null };
    return { ...toRecord({ ...run, result: null } as ModelRun), listAuc: raw.cv_auc ?? raw.in_sample_auc };
  });
}

/**
 * Claims a queued run for one worker: only one claim can succeed, so a run trains exactly once
 * however many workers see its job.
 */
export async function claimModelRun(id: string, workerName: string): Promise<ModelRunRecord | null> {
  const rows: ModelRun[] = await db()
    .getRepository(ModelRun)
    .createQueryBuilder()
    .update(ModelRun)
    .set({
      status: 'running',
      phase: 'loading',
      progress: 0,
      workerName,
      attempts: () => 'attempts + 1',
      startedAt: () => 'now()',
      heartbeatAt: () => 'now()',
    })
    .where('id = :id AND status = :queued', { id, queued: 'queued' })
    .returning('*')
    .execute()
    .then((r) => r.raw);
  if (rows.length === 0) return null;
  return findModelRun(id);
}

/**
 * While a worker trains a run it holds a PostgreSQL session lock named after the run. PostgreSQL
 * drops the lock when the worker's connection goes, so a run whose lock is free has lost its worker.
 */
export async function holdRunLock(id: string): Promise<() => Promise<void>> {
  const runner = db().createQueryRunner();
  await runner.connect();
  await runner.query('SELECT pg_advisory_lock(hashtext($1))', [id]);
  return async () => {
    await runner.query('SELECT pg_advisory_unlock(hashtext($1))', [id]).catch(() => {});
    await runner.release();
  };
}

export const ABANDONED_RUN_MESSAGE =
  'The worker training this run stopped before it finished (it was restarted or ran out of memory). Nothing of this run was stored; start it again.';

/** Marks runs left "running" by a worker that is gone as failed, with a reason; returns their ids. */
export async function failAbandonedRuns(): Promise<string[]> {
  // Runs claimed a moment ago may not hold their lock yet: leave them ten seconds.
  const candidates: { id: string }[] = await db().query(
    "SELECT id FROM model_runs WHERE status = 'running' AND started_at < now() - interval '10 seconds'",
  );
  const failed: string[] = [];
  for (const { id } of candidates) {
    const runner = db().createQueryRunner();
    await runner.connect();
    try {
      const [{ free }] = await runner.query('SELECT pg_try_advisory_lock(hashtext($1)) AS free', [id]);
      if (!free) continue;
      const rows: unknown[] = await runner.query(
        `WITH gone AS (UPDATE model_runs SET status = 'failed', error = $2, finished_at = now()
           WHERE id = $1 AND status = 'running' RETURNING id) SELECT id FROM gone`,
        [id, ABANDONED_RUN_MESSAGE],
      );
      await runner.query('SELECT pg_advisory_unlock(hashtext($1))', [id]);
      if (rows.length > 0) failed.push(id);
    } finally {
      await runner.release();
    }
  }
  return failed;
}

/** Stores progress; returns true when someone asked to cancel the run (or it is no longer running). */
export async function reportProgress(id: string, progress: number, phase: ModelRunPhase): Promise<boolean> {
  const rows: { cancel_requested: boolean }[] = await db().query(
    `UPDATE model_runs SET progress = GREATEST(progress, $2), phase = $3, heartbeat_at = now()
     WHERE id = $1 AND status = 'running' RETURNING cancel_requested`,
    [id, progress, phase],
  );
  return rows.length === 0 || rows[0].cancel_requested;
}

export async function isCancelRequested(id: string): Promise<boolean> {
  const rows: { cancel_requested: boolean; status: ModelRunStatus }[] = await db().query(
    'SELECT cancel_requested, status FROM model_runs WHERE id = $1',
    [id],
  );
  return rows.length === 0 || rows[0].cancel_requested || rows[0].status !== 'running';
}

/** Ends a running run; a run already ended (cancelled meanwhile) stays as it is. */
export async function finishModelRun(
  id: string,
  outcome:
    | { status: 'done'; result: StoredResult }
    | { status: 'failed'; error: string }
    | { status: 'cancelled' },
): Promise<boolean> {
  const rows: unknown[] = await db().query(
    `UPDATE model_runs SET status = $2::varchar, result = $3::jsonb, error = $4::text, finished_at = now(),
       progress = CASE WHEN $2::varchar = 'done' THEN 1 ELSE progress END,
       phase = CASE WHEN $2::varchar = 'done' THEN NULL ELSE phase END
     WHERE id = $1 AND status = 'running' RETURNING id`,
    [
      id,
      outcome.status,
      outcome.status === 'done' ? JSON.stringify(outcome.result) : null,
      outcome.status === 'failed' ? outcome.error : null,
    ],
  );
  return rows.length > 0;
}

/**
 * Asks a run to stop: a queued run is cancelled at once, a running one when its worker next looks
 * (within a second). Returns the status afterwards, or null when the run has already ended.
 */
export async function requestCancel(id: string, audit: AuditEntry): Promise<ModelRunStatus | null> {
  return db().transaction(async (manager) => {
    const run = await manager.findOne(ModelRun, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!run || (run.status !== 'queued' && run.status !== 'running')) return null;
    if (run.status === 'queued') {
      await manager.update(ModelRun, { id }, { status: 'cancelled', finishedAt: new Date() });
    } else {
      await manager.update(ModelRun, { id }, { cancelRequested: true });
    }
    await recordAudit(audit, manager);
    return run.status === 'queued' ? 'cancelled' : 'running';
  });
}

export async function saveDriverAction(
  id: string,
  feature: string,
  text: string,
  audit: AuditEntry,
): Promise<Record<string, string>> {
  return db().transaction(async (manager) => {
    const run = await manager.findOne(ModelRun, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!run) throw new Error('The model run disappeared');
    const actions = { ...run.driverActions };
    if (text === '') delete actions[feature];
    else actions[feature] = text;
    await manager.update(ModelRun, { id }, { driverActions: actions });
    await recordAudit(audit, manager);
    return actions;
  });
}

/**
 * Moves a run's publication state (draft, requested, sent_back, published, withdrawn) and keeps
 * the comment that goes with it. Pass a transaction's manager to do it with other changes.
 */
export async function setPublicationState(
  id: string,
  state: PublicationState,
  comment?: string | null,
  manager?: EntityManager,
): Promise<void> {
  await (manager ?? db().manager).update(
    ModelRun,
    { id },
    { publicationState: state, publicationComment: comment ?? null },
  );
}

/**
 * Moves the publication state from one of `from` to `to`, with its audit line, in one
 * transaction. Returns false (and changes nothing) when the run is in another state.
 */
export async function movePublication(
  id: string,
  from: PublicationState[],
  to: PublicationState,
  comment: string | null,
  audit: AuditEntry,
): Promise<boolean> {
  return db().transaction(async (manager) => {
    const run = await manager.findOne(ModelRun, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!run || !from.includes(run.publicationState)) return false;
    await setPublicationState(id, to, comment, manager);
    await recordAudit(audit, manager);
    return true;
  });
}

/** Everything publishing needs of a run, as plain data. */
export type ModelRunForPublishing = {
  id: string;
  datasetId: string;
  status: ModelRunStatus;
  publicationState: PublicationState;
  needsReview: boolean;
  policyVersion: number;
  /** the k the run was trained under */
  k: number;
  settings: ModelRunSettings;
  /** the feature columns the engine was given (never a blocked field or its derivative) */
  features: string[];
  /** the full pruned tree, not withheld: for computing only, never for showing as it is */
  tree: TreeNode | null;
  drivers: ModelDriver[];
  /** every leaf, not withheld: for computing only */
  segments: Segment[];
};

export async function getModelRunForPublishing(id: string): Promise<ModelRunForPublishing | null> {
  const run = await findModelRun(id);
  if (!run) return null;
  const result = run.result;
  return {
    id: run.id,
    datasetId: run.datasetId,
    status: run.status,
    publicationState: run.publicationState,
    needsReview: run.needsReview,
    policyVersion: run.policyVersion,
    k: run.k,
    settings: run.settings,
    features: run.features,
    tree: result?.tree ?? null,
    drivers: result ? buildDrivers(result, run.k, run.driverActions) : [],
    segments: result?.segments ?? [],
  };
}

/** Marks every run made under an older policy version as needing review; returns how many. */
export async function markRunsNeedingReview(manager: EntityManager, currentVersion: number): Promise<number> {
  const rows: unknown[] = await manager.query(
    `UPDATE model_runs SET needs_review = true
     WHERE policy_version < $1 AND needs_review = false RETURNING id`,
    [currentVersion],
  );
  return rows.length;
}

/** E-mail addresses of the users holding the privacy officer role (those who have signed in). */
export async function privacyOfficerEmails(): Promise<string[]> {
  const users = await db()
    .getRepository(User)
    .createQueryBuilder('u')
    .where(':role = ANY(u.roles)', { role: 'privacy_officer' })
    .orderBy('u.email')
    .getMany();
  return users.map((u) => u.email);
}
