import type { EntityManager } from 'typeorm';
import type { PublicationResponse, PublicationStatus, TeamSummary } from '../../../../shared/briefs';
import type { ComputedTeam } from '../../analysis/team-briefs';
import { Publication } from '../../entities/publication.entity';
import { TeamBriefRecord } from '../../entities/team-brief.entity';
import { batched } from '../../lib/batch';
import { db } from '../../lib/db';
import { type AuditEntry, recordAudit } from '../audit/audit.repository';

export type PublicationRow = {
  id: string;
  modelRunId: string;
  datasetId: string;
  status: PublicationStatus;
  policyVersion: number;
  k: number;
  features: string[];
  publishedAt: string | null;
  teamCount: number | null;
  withheldTeamCount: number | null;
  endReason: string | null;
};

function toRow(p: Publication): PublicationRow {
  return {
    id: p.id,
    modelRunId: p.modelRunId,
    datasetId: p.datasetId,
    status: p.status as PublicationStatus,
    policyVersion: p.policyVersion,
    k: p.k,
    features: p.features,
    publishedAt: p.publishedAt?.toISOString() ?? null,
    teamCount: p.teamCount,
    withheldTeamCount: p.withheldTeamCount,
    endReason: p.endReason,
  };
}

export function toPublicationResponse(p: PublicationRow): PublicationResponse {
  return {
    id: p.id,
    modelRunId: p.modelRunId,
    datasetId: p.datasetId,
    status: p.status,
    teamCount: p.teamCount,
    withheldTeamCount: p.withheldTeamCount,
    publishedAt: p.publishedAt,
    withdrawnReason: p.status === 'withdrawn' || p.status === 'failed' ? p.endReason : null,
  };
}

/** Starts a publication ("computing") and audits the request, in one transaction. */
export async function insertPublication(
  data: Pick<PublicationRow, 'modelRunId' | 'datasetId' | 'policyVersion' | 'k' | 'features'>,
  actor: { id: string; email: string },
  audit: Omit<AuditEntry, 'actor' | 'objectId' | 'objectType'>,
): Promise<PublicationRow> {
  return db().transaction(async (manager) => {
    const repo = manager.getRepository(Publication);
    const saved = await repo.save(
      repo.create({
        ...data,
        status: 'computing',
        publishedById: actor.id,
        publishedByEmail: actor.email,
      }),
    );
    await recordAudit({ ...audit, actor, objectType: 'publication', objectId: saved.id }, manager);
    return toRow(saved);
  });
}

export async function findPublication(id: string): Promise<PublicationRow | null> {
  const found = await db().getRepository(Publication).findOneBy({ id });
  return found ? toRow(found) : null;
}

export async function findComputingPublication(modelRunId: string): Promise<PublicationRow | null> {
  const found = await db().getRepository(Publication).findOneBy({ modelRunId, status: 'computing' });
  return found ? toRow(found) : null;
}

export async function listPublicationsOfRun(modelRunId: string): Promise<PublicationRow[]> {
  const rows = await db()
    .getRepository(Publication)
    .find({ where: { modelRunId }, order: { createdAt: 'DESC' } });
  return rows.map(toRow);
}

/**
 * Stores every team's brief and makes the publication the dataset's published one; an older
 * publication of the same dataset is replaced (its briefs deleted). Returns false when the
 * publication stopped computing meanwhile (withdrawn by a policy change): nothing is stored then.
 */
export async function storeBriefs(
  publicationId: string,
  teams: readonly ComputedTeam[],
  publishedAt: Date,
): Promise<{ stored: boolean; replaced: string[] }> {
  return db().transaction(async (manager) => {
    const repo = manager.getRepository(Publication);
    const publication = await repo
      .createQueryBuilder('p')
      .setLock('pessimistic_write')
      .where('p.id = :id', { id: publicationId })
      .getOne();
    if (publication?.status !== 'computing') return { stored: false, replaced: [] };
    const older = await repo
      .createQueryBuilder('p')
      .setLock('pessimistic_write')
      .where('p.dataset_id = :datasetId AND p.status = :status AND p.id <> :id', {
        datasetId: publication.datasetId,
        status: 'published',
        id: publicationId,
      })
      .getMany();
    for (const old of older) {
      await endPublication(
        manager,
        old.id,
        'replaced',
        `Replaced by a newer publication (${publicationId}).`,
      );
    }
    const briefs = manager.getRepository(TeamBriefRecord);
    for (let i = 0; i < teams.length; i += 200) {
      await briefs.insert(
        teams.slice(i, i + 200).map((team) => ({
          id: team.id,
          publicationId,
          name: team.name,
          department: team.department,
          managerEmail: team.managerEmail,
          withheld: team.withheld,
          headcount: team.headcount,
          summary: { attritionRate: team.attritionRate, organisationRate: team.organisationRate },
          brief: team.brief,
        })),
      );
    }
    const withheld = teams.filter((t) => t.withheld).length;
    await repo.update(publicationId, {
      status: 'published',
      publishedAt,
      teamCount: teams.length,
      withheldTeamCount: withheld,
    });
    await recordAudit(
      {
        actor: publication.publishedById
          ? { id: publication.publishedById, email: publication.publishedByEmail ?? '' }
          : null,
        action: 'briefs.published',
        objectType: 'publication',
        objectId: publicationId,
        details: {
          modelRunId: publication.modelRunId,
          datasetId: publication.datasetId,
          teams: teams.length,
          withheldTeams: withheld,
          k: publication.k,
          replaced: older.map((o) => o.id),
        },
      },
      manager,
    );
    return { stored: true, replaced: older.map((o) => o.modelRunId) };
  });
}

export async function markPublicationFailed(id: string, reason: string): Promise<void> {
  await db()
    .getRepository(Publication)
    .update({ id, status: 'computing' }, { status: 'failed', endedAt: new Date(), endReason: reason });
}

/** Deletes a publication's briefs and records why; inside the caller's transaction. */
async function endPublication(
  manager: EntityManager,
  id: string,
  status: 'replaced' | 'withdrawn',
  reason: string,
): Promise<void> {
  await manager.getRepository(TeamBriefRecord).delete({ publicationId: id });
  await manager.getRepository(Publication).update(id, { status, endedAt: new Date(), endReason: reason });
}

/** Live publications (published or still computing): what a withdrawal looks at. */
export async function listLivePublications(manager?: EntityManager): Promise<PublicationRow[]> {
  const rows = await (manager ?? db().manager)
    .getRepository(Publication)
    .createQueryBuilder('p')
    .where('p.status IN (:...statuses)', { statuses: ['published', 'computing'] })
    .getMany();
  return rows.map(toRow);
}

/** Withdraws publications at once: their briefs are deleted, the reason kept and audited. */
export async function withdrawPublications(
  manager: EntityManager,
  publications: readonly PublicationRow[],
  reason: string,
  actor: AuditEntry['actor'],
): Promise<void> {
  for (const publication of publications) {
    await endPublication(manager, publication.id, 'withdrawn', reason);
    await recordAudit(
      {
        actor,
        action: 'briefs.withdrawn',
        objectType: 'publication',
        objectId: publication.id,
        details: { modelRunId: publication.modelRunId, datasetId: publication.datasetId, reason },
      },
      manager,
    );
  }
}

type TeamListRow = Pick<
  TeamBriefRecord,
  'id' | 'name' | 'department' | 'withheld' | 'headcount' | 'summary'
> & {
  publishedAt: Date;
};

function summaryOf(row: TeamListRow): TeamSummary {
  return {
    id: row.id,
    name: row.name,
    department: row.department,
    headcount: row.withheld ? null : row.headcount,
    withheld: row.withheld,
    ...(row.withheld
      ? {}
      : {
          attritionRate: row.summary.attritionRate ?? undefined,
          organisationRate: row.summary.organisationRate ?? undefined,
        }),
    publishedAt: row.publishedAt.toISOString(),
  };
}

/**
 * Teams of published briefs for concurrent callers at once, as JSON text: each caller asks for all
 * teams (null) or one manager e-mail's; one query answers the batch, and callers asking the same
 * share one serialised answer (plain SQL: the hottest read after the brief).
 */
const listTeamsBatched = batched(async (emails: (string | null)[]) => {
  const wanted = [...new Set(emails.filter((email): email is string => email !== null))];
  const rows: (TeamListRow & { managerEmail: string | null })[] = await db().query(
    `SELECT t.id, t.name, t.department, t.withheld, t.headcount, t.summary, p.published_at AS "publishedAt",
            t.manager_email AS "managerEmail"
       FROM team_briefs t JOIN publications p ON p.id = t.publication_id
      WHERE p.status = 'published' AND ($1::boolean OR t.manager_email = ANY($2::text[]))
      ORDER BY t.department ASC NULLS LAST, t.name ASC`,
    [emails.includes(null), wanted],
  );
  const summaries = rows.map((row) => ({ email: row.managerEmail, summary: summaryOf(row) }));
  const texts = new Map<string | null, string>();
  return emails.map((email) => {
    let text = texts.get(email);
    if (text === undefined) {
      text = JSON.stringify(
        summaries.filter((row) => email === null || row.email === email).map((row) => row.summary),
      );
      texts.set(email, text);
    }
    return text;
  });
});

/** Teams of published briefs as JSON text: all of them, or those of one manager e-mail. */
export function listPublishedTeamsText(managerEmail?: string): Promise<string> {
  return listTeamsBatched(managerEmail ?? null);
}

type BriefViewRequest = {
  id: string;
  viewer: { id: string; email: string };
  managerEmail: string;
  preview: boolean;
  format: 'json' | 'csv';
};

/**
 * Brief views of concurrent requests in one statement: each brief the viewer may open is read and
 * its `brief.view` audit line written by the same statement, so no brief leaves without its audit
 * line committed, and one round trip serves the whole batch.
 */
const viewBriefsBatched = batched(async (views: BriefViewRequest[]) => {
  const rows: { n: string; brief: string }[] = await db().query(
    `WITH input AS (
       SELECT * FROM unnest($1::uuid[], $2::boolean[], $3::text[], $4::uuid[], $5::text[], $6::text[])
              WITH ORDINALITY AS i(team_id, preview, manager_email, actor_id, actor_email, format, n)
     ), b AS (
       SELECT i.n, t.id, t.publication_id, t.brief, i.preview, i.actor_id, i.actor_email, i.format
         FROM input i
         JOIN team_briefs t ON t.id = i.team_id
         JOIN publications p ON p.id = t.publication_id
        WHERE p.status = 'published' AND (i.preview OR t.manager_email = i.manager_email)
     ), audited AS (
       INSERT INTO audit_events (actor_id, actor_email, action, object_type, object_id, details)
       SELECT b.actor_id, b.actor_email, 'brief.view', 'team', b.id::text,
              jsonb_build_object('publicationId', b.publication_id, 'preview', b.preview, 'format', b.format)
         FROM b ORDER BY b.n
     )
     SELECT b.n::text AS n, b.brief::text AS brief FROM b`,
    [
      views.map((v) => v.id),
      views.map((v) => v.preview),
      views.map((v) => v.managerEmail),
      views.map((v) => v.viewer.id),
      views.map((v) => v.viewer.email),
      views.map((v) => v.format),
    ],
  );
  const byIndex = new Map(rows.map((row) => [Number(row.n), row.brief]));
  return views.map((_view, i) => byIndex.get(i + 1) ?? null);
});

/**
 * The JSON text of a published brief the viewer may open (their own team, or any team when
 * `preview`), with its `brief.view` audit line written by the same statement. Null when the brief
 * is unknown, withdrawn or not the viewer's; the caller then works out which, and audits the
 * refusal. `id` must be a UUID (the caller checks).
 */
export function viewPublishedBriefText(input: BriefViewRequest): Promise<string | null> {
  return viewBriefsBatched(input);
}

/** Every manager e-mail with at least one team in a publication. */
export async function managersOf(publicationId: string): Promise<string[]> {
  const rows: { email: string }[] = await db().query(
    `SELECT DISTINCT manager_email AS email FROM team_briefs WHERE publication_id = $1 AND manager_email IS NOT NULL ORDER BY 1`,
    [publicationId],
  );
  return rows.map((r) => r.email);
}
