import { LessThan } from 'typeorm';
import { Dataset } from '../../entities/dataset.entity';
import { db } from '../../lib/db';
import { deleteDataset } from '../datasets/datasets.repository';
import { currentPolicy } from './policy.service';

const DAY_MS = 86_400_000;

export type RetentionResult = { cutoff: string; retentionDays: number; deleted: string[] };

/**
 * Deletes every dataset uploaded more than `retentionDays` before `now`, with everything derived
 * from it (its columns, reviews and decisions go by ON DELETE CASCADE), one audit line each.
 */
export async function runRetention(now = new Date()): Promise<RetentionResult> {
  const { retentionDays, version } = await currentPolicy();
  const cutoff = new Date(now.getTime() - retentionDays * DAY_MS);
  const due = await db()
    .getRepository(Dataset)
    .find({
      where: { uploadedAt: LessThan(cutoff) },
      select: { id: true, name: true, rowCount: true, uploadedAt: true },
      order: { uploadedAt: 'ASC' },
    });
  const deleted: string[] = [];
  for (const dataset of due) {
    const gone = await deleteDataset(dataset.id, {
      actor: null,
      action: 'dataset.deleted',
      objectType: 'dataset',
      objectId: dataset.id,
      details: {
        reason: 'retention',
        retentionDays,
        policyVersion: version,
        uploadedAt: dataset.uploadedAt.toISOString(),
        name: dataset.name,
        rows: dataset.rowCount,
      },
    });
    if (gone) deleted.push(dataset.id);
  }
  return { cutoff: cutoff.toISOString(), retentionDays, deleted };
}
