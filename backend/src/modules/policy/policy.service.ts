import type { EntityManager } from 'typeorm';
import { POLICY_DEFAULTS, type Policy, type PolicyUpdate } from '../../../../shared/policy';
import { db } from '../../lib/db';
import { AppError } from '../../lib/errors';
import { recordAudit } from '../audit/audit.repository';
import type { SessionUser } from '../auth/session-types';
import { findCurrentPolicy, insertPolicyVersion, listPolicyVersions, lockPolicy } from './policy.repository';

/** What changed between two versions, for whoever must react (needs review, withdrawn briefs). */
export type PolicyChange = {
  previous: Policy;
  current: Policy;
  /** k went up: briefs published under the lower k may show groups now too small */
  kRaised: boolean;
  /** fields blocked now that were allowed before */
  newlyBlocked: string[];
  /** fields allowed now that were blocked before */
  unblocked: string[];
};

export type PolicyChangeListener = (change: PolicyChange, manager: EntityManager) => Promise<void>;

const listeners: PolicyChangeListener[] = [];

/**
 * Runs `listener` inside the transaction of every policy change, after the new version is stored:
 * mark datasets and model runs made under older versions "needs review", withdraw briefs. If it
 * throws, the change is rolled back and the policy stays as it was. Returns a function that
 * removes the listener.
 */
export function onPolicyChange(listener: PolicyChangeListener): () => void {
  listeners.push(listener);
  return () => {
    const index = listeners.indexOf(listener);
    if (index >= 0) listeners.splice(index, 1);
  };
}

/** The policy in force. Pass the transaction's manager to read it inside a transaction. */
export async function currentPolicy(manager?: EntityManager): Promise<Policy> {
  const policy = await findCurrentPolicy(manager);
  if (policy) return policy;
  // Only reachable on a database whose first version was removed by hand.
  return {
    version: 0,
    ...POLICY_DEFAULTS,
    reason: 'Defaults',
    authorEmail: null,
    createdAt: new Date(0).toISOString(),
  };
}

/** The version number that dataset approvals and model runs record. */
export async function policyVersion(manager?: EntityManager): Promise<number> {
  return (await currentPolicy(manager)).version;
}

export function policyHistory(): Promise<Policy[]> {
  return listPolicyVersions();
}

function sameSettings(a: Policy, b: PolicyUpdate): boolean {
  return (
    a.k === b.k &&
    a.proxyThreshold === b.proxyThreshold &&
    a.retentionDays === b.retentionDays &&
    a.blockedFields.length === b.blockedFields.length &&
    [...a.blockedFields].sort().join('\u0000') === [...b.blockedFields].sort().join('\u0000')
  );
}

/**
 * Stores the next version, audits it and tells the listeners, all in one transaction (the
 * caller's, when it passes its manager).
 */
export async function changePolicy(
  actor: SessionUser,
  update: PolicyUpdate,
  outer?: EntityManager,
): Promise<Policy> {
  const run = <T>(work: (manager: EntityManager) => Promise<T>) =>
    outer ? work(outer) : db().transaction(work);
  return run(async (manager) => {
    await lockPolicy(manager);
    const previous = await currentPolicy(manager);
    if (sameSettings(previous, update)) {
      throw new AppError(
        'policy_unchanged',
        400,
        `These settings are already version ${previous.version} of the policy; change at least one of them.`,
      );
    }
    const { reason, ...settings } = update;
    const current = await insertPolicyVersion(manager, settings, reason, actor);
    const change: PolicyChange = {
      previous,
      current,
      kRaised: current.k > previous.k,
      newlyBlocked: current.blockedFields.filter((f) => !previous.blockedFields.includes(f)),
      unblocked: previous.blockedFields.filter((f) => !current.blockedFields.includes(f)),
    };
    await recordAudit(
      {
        actor,
        action: 'policy.change',
        objectType: 'policy',
        objectId: String(current.version),
        details: {
          reason,
          fromVersion: previous.version,
          k: { from: previous.k, to: current.k },
          proxyThreshold: { from: previous.proxyThreshold, to: current.proxyThreshold },
          retentionDays: { from: previous.retentionDays, to: current.retentionDays },
          blocked: change.newlyBlocked,
          unblocked: change.unblocked,
        },
      },
      manager,
    );
    for (const listener of listeners) await listener(change, manager);
    return current;
  });
}
