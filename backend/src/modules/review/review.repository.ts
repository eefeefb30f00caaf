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
