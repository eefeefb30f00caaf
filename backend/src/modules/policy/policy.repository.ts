import type { EntityManager } from 'typeorm';
import type { Policy, PolicySettings } from '../../../../shared/policy';
import { PolicyVersion } from '../../entities/policy-version.entity';
import { db } from '../../lib/db';

function toPolicy(row: PolicyVersion): Policy {
  return {
    version: row.version,
    k: row.k,
    blockedFields: row.blockedFields,
    proxyThreshold: row.proxyThreshold,
    retentionDays: row.retentionDays,
    reason: row.reason,
    authorEmail: row.authorEmail,
    createdAt: row.createdAt.toISOString(),
  };
}

export async function findCurrentPolicy(manager?: EntityManager): Promise<Policy | null> {
  const row = await (manager ?? db().manager)
    .getRepository(PolicyVersion)
    .createQueryBuilder('p')
    .orderBy('p.version', 'DESC')
    .limit(1)
    .getOne();
  return row ? toPolicy(row) : null;
}

export async function listPolicyVersions(): Promise<Policy[]> {
  const rows = await db()
    .getRepository(PolicyVersion)
    .find({ order: { version: 'DESC' } });
  return rows.map(toPolicy);
}

/** Serialises policy changes: the caller's transaction holds the lock until it ends. */
export async function lockPolicy(manager: EntityManager): Promise<void> {
  await manager.query(`SELECT pg_advisory_xact_lock(hashtext('coppice.policy'))`);
}

export async function insertPolicyVersion(
  manager: EntityManager,
  settings: PolicySettings,
  reason: string,
  author: { id: string; email: string },
): Promise<Policy> {
  const repo = manager.getRepository(PolicyVersion);
  const row = repo.create({
    ...settings,
    reason,
    authorId: author.id,
    authorEmail: author.email,
  });
  const saved = await repo.save(row);
  return toPolicy((await repo.findOneByOrFail({ version: saved.version })) as PolicyVersion);
}
