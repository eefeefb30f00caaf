import type { EntityManager } from 'typeorm';
import type { Policy } from '../../../../shared/policy';
import type {
  ApprovalBody,
  ApprovalState,
  ApprovalStatusView,
  ProxyDecisionBody,
  ProxyReportView,
  ReviewQueueItem,
} from '../../../../shared/privacy';
import {
  type Cell,
  type ColumnKind,
  DEFAULT_QUANTILE_BINS,
  type ProxyRow,
  proxyReport,
} from '../../analysis/association';
import { db } from '../../lib/db';
import { AppError, conflict, notFound } from '../../lib/errors';
import { recordAudit } from '../audit/audit.repository';
import type { SessionUser } from '../auth/session-types';
import { loadDatasetColumns } from '../datasets/datasets.repository';
import { listPolicyVersions } from '../policy/policy.repository';
import { changePolicy, currentPolicy } from '../policy/policy.service';
import {
  findReviewedDataset,
  insertApproval,
  insertProxyDecision,
  latestProxyDecisions,
  listApprovals,
  listMappedDatasets,
  listRequestedRuns,
  type ReviewedDataset,
  type StoredApproval,
} from './review.repository';

async function reviewedDataset(id: string, manager?: EntityManager): Promise<ReviewedDataset> {
  const dataset = await findReviewedDataset(id, manager);
  if (!dataset) throw notFound('The dataset');
  return dataset;
}

/**
 * Association of every allowed feature with every blocked field of the policy in force, with the
 * privacy officers' decisions. A blocked date of birth is compared as age, as the engine sees it.
 */
export async function getProxyReport(datasetId: string): Promise<ProxyReportView> {
  const dataset = await reviewedDataset(datasetId);
  const [policy, decisions] = await Promise.all([currentPolicy(), latestProxyDecisions(datasetId)]);
  const key = `${datasetId}|${policy.version}|${dataset.mappedAt?.getTime()}`;
  let rows = reportCache.get(key);
  if (!rows) {
    rows = await computeProxyRows(datasetId, policy);
    reportCache.set(key, rows);
    if (reportCache.size > REPORT_CACHE_SIZE) reportCache.delete(reportCache.keys().next().value!);
  }
  const decisionOf = new Map(decisions.map((d) => [`${d.feature}\u0000${d.blockedField}`, d]));
  return {
    datasetId,
    policyVersion: policy.version,
    threshold: policy.proxyThreshold,
    bins: DEFAULT_QUANTILE_BINS,
    rows: rows.map((row) => {
      const decision = decisionOf.get(`${row.feature}\u0000${row.blockedField}`);
      return {
        ...row,
        decision: decision
          ? {
              decision: decision.decision,
              reason: decision.reason,
              by: decision.decidedByEmail,
              at: decision.decidedAt.toISOString(),
            }
          : null,
      };
    }),
  };
}

// The association figures depend only on the stored values, the mapping and the policy: a few are
// kept, so that reading the report again (after each decision) does not recompute it.
const REPORT_CACHE_SIZE = 16;
const reportCache = new Map<string, ProxyRow[]>();

async function computeProxyRows(datasetId: string, policy: Policy): Promise<ProxyRow[]> {
  const engine = await loadDatasetColumns(datasetId);
  const blocked = new Set(policy.blockedFields);
  const columns: Record<string, readonly Cell[]> = {};
  const kinds: Record<string, ColumnKind> = {};
  const allowed: string[] = [];
  const blockedPresent: string[] = [];
  for (const feature of engine.features) {
    const blockedName = blocked.has(feature.name)
      ? feature.name
      : feature.derivedFrom && blocked.has(feature.derivedFrom)
        ? feature.derivedFrom
        : null;
    const name = blockedName ?? feature.name;
    columns[name] = feature.values;
    kinds[name] = feature.kind === 'numeric' ? 'numeric' : 'categorical';
    if (blockedName) blockedPresent.push(blockedName);
    else allowed.push(feature.name);
  }
  return proxyReport(columns, allowed, blockedPresent, policy.proxyThreshold, { kinds });
}

/**
 * Blocks a flagged field too (a new policy version) or accepts it with a reason; both audited, in
 * one transaction.
 */
export async function decideProxy(
  actor: SessionUser,
  datasetId: string,
  body: ProxyDecisionBody,
): Promise<ProxyReportView> {
  const dataset = await reviewedDataset(datasetId);
  const report = await getProxyReport(datasetId);
  const row = report.rows.find((r) => r.feature === body.feature && r.blockedField === body.blockedField);
  if (!row) {
    throw new AppError(
      'unknown_pair',
      422,
      `"${body.feature}" against "${body.blockedField}" is not in this dataset's proxy report; reload the report.`,
    );
  }
  await db().transaction(async (manager) => {
    let policyVersion = report.policyVersion;
    if (body.decision === 'block') {
      const policy = await currentPolicy(manager);
      if (!policy.blockedFields.includes(body.feature)) {
        const next = await changePolicy(
          actor,
          {
            k: policy.k,
            blockedFields: [...policy.blockedFields, body.feature],
            proxyThreshold: policy.proxyThreshold,
            retentionDays: policy.retentionDays,
            reason:
              `Blocked as a proxy for ${body.blockedField} (dataset "${dataset.name}"): ${body.reason}`.slice(
                0,
                500,
              ),
          },
          manager,
        );
        policyVersion = next.version;
      }
    }
    await insertProxyDecision(manager, {
      ...body,
      datasetId,
      cramersV: row.cramersV,
      policyVersion,
      decidedById: actor.id,
      decidedByEmail: actor.email,
    });
    await recordAudit(
      {
        actor,
        action: body.decision === 'block' ? 'dataset.proxy_blocked' : 'dataset.proxy_accepted',
        objectType: 'dataset',
        objectId: datasetId,
        details: {
          feature: body.feature,
          blockedField: body.blockedField,
          cramersV: Number(row.cramersV.toFixed(4)),
          reason: body.reason,
          policyVersion,
        },
      },
      manager,
    );
  });
  return getProxyReport(datasetId);
}

function sameModellingSettings(a: Policy, b: Policy): string[] {
  const changes: string[] = [];
  if (a.k !== b.k) changes.push(`k changed from ${a.k} to ${b.k}`);
  const added = b.blockedFields.filter((f) => !a.blockedFields.includes(f));
  const removed = a.blockedFields.filter((f) => !b.blockedFields.includes(f));
  if (added.length) changes.push(`newly blocked: ${added.join(', ')}`);
  if (removed.length) changes.push(`no longer blocked: ${removed.join(', ')}`);
  if (a.proxyThreshold !== b.proxyThreshold) {
    changes.push(`proxy threshold changed from ${a.proxyThreshold} to ${b.proxyThreshold}`);
  }
  return changes;
}

function stateOf(
  dataset: ReviewedDataset,
  latest: StoredApproval | null,
  versions: Policy[],
  current: Policy,
): { state: ApprovalState; reasons: string[] } {
  if (dataset.status !== 'mapped' || !dataset.mappedAt) {
    return { state: 'not-mapped', reasons: ['The analyst has not mapped the dataset yet.'] };
  }
  if (!latest)
    return { state: 'awaiting-review', reasons: ['No privacy officer has reviewed this dataset yet.'] };
  if (latest.mappedAt.getTime() < dataset.mappedAt.getTime()) {
    return { state: 'awaiting-review', reasons: ['The mapping changed after the last review.'] };
  }
  if (latest.decision === 'sent-back') {
    return { state: 'sent-back', reasons: [`Sent back: ${latest.comment ?? 'no comment'}`] };
  }
  if (latest.policyVersion !== current.version) {
    const then = versions.find((v) => v.version === latest.policyVersion);
    const changes = then
      ? sameModellingSettings(then, current)
      : ['the policy it was approved under is unknown'];
    if (changes.length > 0) {
      return {
        state: 'needs-review',
        reasons: [
          `Approved under policy version ${latest.policyVersion}; the policy is now version ${current.version} (${changes.join('; ')}).`,
        ],
      };
    }
  }
  return { state: 'approved', reasons: [] };
}

const view = (a: StoredApproval) => ({
  decision: a.decision,
  comment: a.comment,
  policyVersion: a.policyVersion,
  decidedBy: a.decidedByEmail,
  decidedAt: a.decidedAt.toISOString(),
});

export async function approvalStatus(
  datasetId: string,
  manager?: EntityManager,
): Promise<ApprovalStatusView> {
  const dataset = await reviewedDataset(datasetId, manager);
  const [history, versions, current] = await Promise.all([
    listApprovals(datasetId, manager),
    listPolicyVersions(),
    currentPolicy(manager),
  ]);
  const { state, reasons } = stateOf(dataset, history[0] ?? null, versions, current);
  return {
    datasetId,
    state,
    reasons,
    currentPolicyVersion: current.version,
    latest: history[0] ? view(history[0]) : null,
    history: history.map(view),
  };
}

/**
 * For model runs: the dataset must be approved under the policy in force (409 with the reason
 * otherwise). Returns the policy version to record with the run.
 */
export async function assertApprovedForModelling(
  datasetId: string,
  manager?: EntityManager,
): Promise<number> {
  const status = await approvalStatus(datasetId, manager);
  if (status.state !== 'approved') {
    const why: Record<ApprovalState, string> = {
      'not-mapped': 'Map the dataset and ask a privacy officer to approve it before training a model.',
      'awaiting-review': 'A privacy officer must approve this dataset before any model is trained on it.',
      'sent-back':
        'A privacy officer sent this dataset back; change the mapping as asked, then it is reviewed again.',
      'needs-review':
        'The privacy policy changed since this dataset was approved; a privacy officer must review it again.',
      approved: '',
    };
    throw conflict(`${why[status.state]} ${status.reasons.join(' ')}`.trim(), { state: status.state });
  }
  return status.currentPolicyVersion;
}

/** Approves a mapped dataset for modelling (every flagged proxy decided first) or sends it back. */
export async function decideApproval(
  actor: SessionUser,
  datasetId: string,
  body: ApprovalBody,
): Promise<ApprovalStatusView> {
  const dataset = await reviewedDataset(datasetId);
  if (dataset.status !== 'mapped' || !dataset.mappedAt) {
    throw conflict('The dataset is not mapped yet: the analyst maps it first, then it can be reviewed.', {
      state: 'not-mapped',
    });
  }
  if (body.decision === 'approve') {
    const report = await getProxyReport(datasetId);
    const open = report.rows.filter((r) => r.flagged && !r.decision);
    if (open.length > 0) {
      throw conflict(
        `Decide on every flagged proxy first (block it too, or accept it with a reason): ${open
          .map((r) => `${r.feature} for ${r.blockedField}`)
          .join('; ')}.`,
        { undecided: open.map((r) => ({ feature: r.feature, blockedField: r.blockedField })) },
      );
    }
  }
  return db().transaction(async (manager) => {
    const policy = await currentPolicy(manager);
    const decision = body.decision === 'approve' ? 'approved' : 'sent-back';
    await insertApproval(manager, {
      datasetId,
      decision,
      comment: body.comment || null,
      policyVersion: policy.version,
      mappedAt: dataset.mappedAt!,
      decidedById: actor.id,
      decidedByEmail: actor.email,
    });
    await recordAudit(
      {
        actor,
        action: decision === 'approved' ? 'dataset.approved' : 'dataset.sent_back',
        objectType: 'dataset',
        objectId: datasetId,
        details: { policyVersion: policy.version, comment: body.comment ?? null },
      },
      manager,
    );
    return approvalStatus(datasetId, manager);
  });
}

/**
 * What waits for a privacy officer: mapped datasets to approve for modelling, then model runs whose
 * publication an analyst requested; each group oldest first.
 */
export async function reviewQueue(): Promise<ReviewQueueItem[]> {
  const [datasets, versions, current, runs] = await Promise.all([
    listMappedDatasets(),
    listPolicyVersions(),
    currentPolicy(),
    listRequestedRuns(),
  ]);
  const items: ReviewQueueItem[] = [];
  for (const dataset of datasets) {
    const [latest] = await listApprovals(dataset.id);
    const { state, reasons } = stateOf(dataset, latest ?? null, versions, current);
    if (state !== 'awaiting-review' && state !== 'needs-review') continue;
    items.push({
      kind: 'dataset',
      id: dataset.id,
      name: dataset.name,
      rowCount: dataset.rowCount,
      uploadedBy: dataset.uploadedByEmail,
      mappedAt: dataset.mappedAt?.toISOString() ?? null,
      state,
      reasons,
    });
  }
  for (const run of runs) {
    items.push({
      kind: 'publication',
      id: run.id,
      datasetId: run.datasetId,
      datasetName: run.datasetName,
      requestedBy: run.requestedByEmail,
      requestedAt: run.requestedAt?.toISOString() ?? null,
      note: run.note,
      policyVersion: run.policyVersion,
      needsReview: run.needsReview,
    });
  }
  return items;
}
