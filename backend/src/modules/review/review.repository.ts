import type { EntityManager } from 'typeorm';
import type { ProxyDecisionBody } from '../../../../shared/privacy';
import { Dataset } from '../../entities/dataset.entity';
import { DatasetApproval } from '../../entities/dataset-approval.entity';
import { ProxyDecision } from '../../entities/proxy-decision.entity';
import { db } from '../../lib/db';

export type ReviewedDataset = {
  id: string;
  name: string;
  status: 'profiled' | 'mapped';
  rowCount: number;
  uploadedByEmail: string;
  mappedAt: Date | null;
};

export type StoredApproval = {
  decision: 'approved' | 'sent-back';
  comment: string | null;
  policyVersion: number;
  mappedAt: Date;
  decidedByEmail: string;
  decidedAt: Date;
};

export type StoredProxyDecision = {
  feature: string;
  blockedField: string;
  decision: 'block' | 'accept';
  reason: string;
  decidedByEmail: string;
  decidedAt: Date;
};

const datasetColumns = {
  id: true,
  name: true,
  status: true,
  rowCount: true,
  uploadedByEmail: true,
  mappedAt: true,
} as const;

export async function findReviewedDataset(
  id: string,
  manager?: EntityManager,
): Promise<ReviewedDataset | null> {
  return (manager ?? db().manager).getRepository(Dataset).findOne({ where: { id }, select: datasetColumns });
}

export async function listMappedDatasets(): Promise<ReviewedDataset[]> {
  return db()
    .getRepository(Dataset)
    .find({ where: { status: 'mapped' }, select: datasetColumns, order: { mappedAt: 'ASC' } });
}

/** Every decision on a dataset, newest first. */
export async function listApprovals(datasetId: string, manager?: EntityManager): Promise<StoredApproval[]> {
  return (manager ?? db().manager).getRepository(DatasetApproval).find({
    where: { datasetId },
    order: { decidedAt: 'DESC' },
    select: {
      decision: true,
      comment: true,
      policyVersion: true,
      mappedAt: true,
      decidedByEmail: true,
      decidedAt: true,
    },
  });
}

export async function insertApproval(
  manager: EntityManager,
  approval: Omit<StoredApproval, 'decidedAt'> & { datasetId: string; decidedById: string },
): Promise<void> {
  await manager.getRepository(DatasetApproval).insert(approval);
}

/** The latest decision per (feature, blocked field) of a dataset. */
export async function latestProxyDecisions(datasetId: string): Promise<StoredProxyDecision[]> {
  const rows = await db()
    .getRepository(ProxyDecision)
    .find({ where: { datasetId }, order: { decidedAt: 'DESC' } });
  const seen = new Set<string>();
  return rows.filter((row) => {
    const key = `${row.feature}\u0000${row.blockedField}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

export async function insertProxyDecision(
  manager: EntityManager,
  decision: ProxyDecisionBody & {
    datasetId: string;
    cramersV: number;
    policyVersion: number;
    decidedById: string;
    decidedByEmail: string;
  },
): Promise<void> {
  await manager.getRepository(ProxyDecision).insert(decision);
}

export type RequestedRun = {
  id: string;
  datasetId: string;
  datasetName: string | null;
  policyVersion: number;
  needsReview: boolean;
  note: string | null;
  requestedByEmail: string | null;
  requestedAt: Date | null;
};

/**
 * Model runs whose publication is requested and not yet decided, oldest request first. A run whose
 * briefs are being computed (or just stored) is decided already, though its state still says
 * requested until the briefs job finishes. Who asked and when comes from the audit trail's latest
 * request line: the run itself keeps only the state and the note.
 */
export async function listRequestedRuns(): Promise<RequestedRun[]> {
  const rows: {
    id: string;
    dataset_id: string;
    dataset_name: string | null;
    policy_version: number;
    needs_review: boolean;
    publication_comment: string | null;
    actor_email: string | null;
    at: Date | null;
  }[] = await db().query(
    `SELECT r.id, r.dataset_id, r.dataset_name, r.policy_version, r.needs_review, r.publication_comment,
            req.actor_email, req.at
     FROM model_runs r
     LEFT JOIN LATERAL (
       SELECT a.actor_email, a.at FROM audit_events a
       WHERE a.action = 'model.publication_request' AND a.object_type = 'model_run'
         AND a.object_id = r.id::text
       ORDER BY a.at DESC, a.id DESC LIMIT 1
     ) req ON true
     WHERE r.publication_state = 'requested'
       AND NOT EXISTS (
         SELECT 1 FROM publications p WHERE p.model_run_id = r.id AND p.status IN ('computing', 'published')
       )
     ORDER BY req.at ASC NULLS FIRST, r.created_at ASC`,
  );
  return rows.map((row) => ({
    id: row.id,
    datasetId: row.dataset_id,
    datasetName: row.dataset_name,
    policyVersion: row.policy_version,
    needsReview: row.needs_review,
    note: row.publication_comment,
    requestedByEmail: row.actor_email,
    requestedAt: row.at,
  }));
}
