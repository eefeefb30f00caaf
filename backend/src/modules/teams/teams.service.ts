import type { EntityManager } from 'typeorm';
import type { PublicationResponse, PublishBody, TeamBriefResponse } from '../../../../shared/briefs';
import { treeFeatures } from '../../analysis/team-briefs';
import { queueBriefs } from '../../jobs/briefs.job';
import { AppError, conflict, notFound } from '../../lib/errors';
import { type AuditEntry, recordAudit } from '../audit/audit.repository';
import type { SessionUser } from '../auth/session-types';
import { currentPolicy, onPolicyChange } from '../policy/policy.service';
import { briefSources } from './brief-sources';
import {
  findComputingPublication,
  insertPublication,
  listLivePublications,
  listPublicationsOfRun,
  listPublishedTeamsText,
  toPublicationResponse,
  viewPublishedBriefText,
  withdrawPublications,
} from './teams.repository';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Analysts and privacy officers may open any brief, to preview it exactly as its manager sees it. */
export function maySeeAllTeams(user: SessionUser): boolean {
  return user.roles.includes('analyst') || user.roles.includes('privacy_officer');
}

/** `POST /api/models/:id/publish`: starts computing the run's briefs in a job. */
export async function publishRun(
  actor: SessionUser,
  modelRunId: string,
  body: PublishBody,
  appUrl: string,
): Promise<PublicationResponse> {
  const run = UUID.test(modelRunId) ? await briefSources().loadRun(modelRunId) : null;
  if (!run) throw notFound('The model run');
  if (run.publicationState !== 'requested') {
    throw conflict(
      'Only a model run whose publication the analyst has requested can be published; ask the analyst to request publication first.',
      { publicationState: run.publicationState },
    );
  }
  if (run.needsReview) {
    throw conflict(
      'The privacy policy changed since this model run was trained; the analyst must review it (or train a new run) before it is published.',
    );
  }
  if (await findComputingPublication(run.id)) {
    throw conflict('The briefs of this model run are being computed already; wait for them to be published.');
  }
  const policy = await currentPolicy();
  const features = treeFeatures(run.tree);
  const blocked = features.filter((f) => policy.blockedFields.includes(f));
  if (blocked.length > 0) {
    throw new AppError(
      'uses_blocked_fields',
      409,
      `The model run splits on fields the privacy policy now blocks (${blocked.join(', ')}); train a new run without them.`,
      { blocked },
    );
  }
  const publication = await insertPublication(
    { modelRunId: run.id, datasetId: run.datasetId, policyVersion: policy.version, k: policy.k, features },
    actor,
    {
      action: 'briefs.publish',
      details: {
        modelRunId: run.id,
        datasetId: run.datasetId,
        k: policy.k,
        policyVersion: policy.version,
        ...(body.comment ? { comment: body.comment } : {}),
      },
    },
  );
  await queueBriefs({ publicationId: publication.id, appUrl });
  return toPublicationResponse(publication);
}

export async function publicationsOfRun(modelRunId: string): Promise<PublicationResponse[]> {
  if (!UUID.test(modelRunId)) return [];
  return (await listPublicationsOfRun(modelRunId)).map(toPublicationResponse);
}

/** `GET /api/teams`: a manager's own teams (matched on the signed-in e-mail), or every team. */
/** The teams a user may see, as the JSON text of a TeamSummary[] (sent as it is). */
export function listTeamsText(user: SessionUser): Promise<string> {
  return listPublishedTeamsText(maySeeAllTeams(user) ? undefined : user.email.trim().toLowerCase());
}

/**
 * One team brief as JSON text, straight from the database (no parse and re-serialise on the
 * busiest read). A manager gets only the briefs of their own teams: any other id, whether it
 * exists or not, is 403, so ids cannot be probed. Every view and every refusal is audited.
 */
export async function viewBriefText(
  user: SessionUser,
  teamId: string,
  format: 'json' | 'csv',
): Promise<string> {
  const preview = maySeeAllTeams(user);
  const text = UUID.test(teamId)
    ? await viewPublishedBriefText({
        id: teamId,
        viewer: user,
        managerEmail: user.email.trim().toLowerCase(),
        preview,
        format,
      })
    : null;
  if (text !== null) return text;
  if (!preview) {
    await recordAudit({
      actor: user,
      action: 'brief.refused',
      objectType: 'team',
      objectId: teamId.slice(0, 64),
      details: { format },
    });
    throw new AppError(
      'not_your_team',
      403,
      'This brief is not about one of your teams. Your own teams are listed under "My teams".',
    );
  }
  throw notFound('The team brief');
}

/** One team brief as an object (for the CSV export); see viewBriefText. */
export async function viewBrief(
  user: SessionUser,
  teamId: string,
  format: 'json' | 'csv',
): Promise<TeamBriefResponse> {
  return JSON.parse(await viewBriefText(user, teamId, format)) as TeamBriefResponse;
}

/** Withdraws the briefs of a dataset at once (its deletion): for the datasets module to call in its transaction. */
export async function withdrawBriefsOfDataset(
  manager: EntityManager,
  datasetId: string,
  actor: AuditEntry['actor'],
): Promise<void> {
  const live = (await listLivePublications(manager)).filter((p) => p.datasetId === datasetId);
  await withdrawPublications(manager, live, 'The dataset was deleted.', actor);
}

let withdrawalRegistered = false;

/**
 * When k rises above a publication's k, or a field its tree splits on becomes blocked, its briefs
 * are withdrawn in the policy change's own transaction; the reason stays on the publication for
 * the analyst (`GET /api/models/:id/publications`).
 */
export function withdrawBriefsOnPolicyChange(): void {
  if (withdrawalRegistered) return;
  withdrawalRegistered = true;
  onPolicyChange(async (change, manager) => {
    const { current } = change;
    const byReason = new Map<string, Awaited<ReturnType<typeof listLivePublications>>>();
    for (const publication of await listLivePublications(manager)) {
      const blocked = publication.features.filter((f) => current.blockedFields.includes(f));
      const reason =
        current.k > publication.k
          ? `Withdrawn by privacy policy version ${current.version}: k rose from ${publication.k} to ${current.k}, so these briefs may show groups that are now too small.`
          : blocked.length > 0
            ? `Withdrawn by privacy policy version ${current.version}: it blocks ${blocked.join(', ')}, which the published model uses.`
            : null;
      if (reason) byReason.set(reason, [...(byReason.get(reason) ?? []), publication]);
    }
    for (const [reason, publications] of byReason) {
      await withdrawPublications(manager, publications, reason, null);
    }
  });
}
