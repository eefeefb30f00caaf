import { randomUUID } from 'node:crypto';
import { computeTeamBriefsInWorker } from '../../analysis/team-briefs-in-worker';
import { queueMail } from '../../jobs/mail.job';
import { logger } from '../../lib/logger';
import { currentPolicy } from '../policy/policy.service';
import { briefSources } from './brief-sources';
import { findPublication, managersOf, markPublicationFailed, storeBriefs } from './teams.repository';

export type BriefsJob = { publicationId: string; appUrl: string };

/** The e-mail to each manager: a link and no figures, not even team names. */
export function briefsReadyMail(appUrl: string): { subject: string; text: string } {
  return {
    subject: 'Team briefs are ready in Coppice',
    text: [
      'Hello,',
      '',
      'New team briefs for the teams you manage have been published in Coppice. Open them here:',
      `${appUrl}/teams`,
      '',
      'The briefs describe groups of employees, never individuals, and are not for decisions about any one person.',
      '',
      'Coppice',
    ].join('\n'),
  };
}

/**
 * The job: computes every team's brief once, stores them, then tells the managers. A failed
 * e-mail is retried by the mail queue and never undoes the publication.
 */
export async function computePublication({ publicationId, appUrl }: BriefsJob): Promise<void> {
  const publication = await findPublication(publicationId);
  if (!publication || publication.status !== 'computing') return;
  try {
    const sources = briefSources();
    const run = await sources.loadRun(publication.modelRunId);
    if (!run) throw new Error('The model run no longer exists.');
    const columns = await sources.loadColumns(publication.datasetId);
    const policy = await currentPolicy();
    const publishedAt = new Date();
    const computed = await computeTeamBriefsInWorker(
      columns,
      { tree: run.tree, drivers: run.drivers },
      {
        k: Math.max(publication.k, policy.k),
        blockedFields: policy.blockedFields,
        window: columns.window,
        publishedAt: publishedAt.toISOString(),
      },
    );
    const teams = computed.map((team) => {
      const id = randomUUID();
      return { ...team, id, brief: { ...team.brief, team: { ...team.brief.team, id } } };
    });
    const { stored } = await storeBriefs(publicationId, teams, publishedAt);
    if (!stored) return;
    await sources
      .setPublicationState?.(publication.modelRunId, 'published')
      .catch((error) => logger.warn({ err: error, publicationId }, 'could not mark the model run published'));
    const mail = briefsReadyMail(appUrl);
    for (const email of await managersOf(publicationId)) {
      await queueMail({ to: [email], ...mail }).catch((error) =>
        logger.warn({ err: error, publicationId }, 'could not queue a brief e-mail'),
      );
    }
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    logger.error({ err: error, publicationId }, 'computing team briefs failed');
    await markPublicationFailed(publicationId, reason);
  }
}
