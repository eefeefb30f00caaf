import type { PublicationStatus } from '../../../../../shared/briefs';
import { Button } from '../../../components/button';
import { ErrorNotice } from '../../../components/error-notice';
import { usePublications } from '../api/get-publications';
import { usePublishRun } from '../api/publish-run';

const STATUS_WORDS: Record<PublicationStatus, string> = {
  computing: 'Computing the team briefs…',
  published: 'Published to the managers',
  failed: 'Computing failed',
  replaced: 'Replaced by a newer publication',
  withdrawn: 'Withdrawn',
};

export type PublishBriefsPanelProps = {
  runId: string;
  /** the run's publication state: only a requested run can be published */
  publicationState: string;
  canPublish: boolean;
  /** after publishing starts (the route refreshes the run) */
  onPublished?: () => void;
};

/** The run's team brief publications, and the privacy officer's "Publish team briefs". */
export function PublishBriefsPanel({
  runId,
  publicationState,
  canPublish,
  onPublished,
}: PublishBriefsPanelProps) {
  const publications = usePublications(runId);
  const publish = usePublishRun();
  const computing = publications.data?.some((p) => p.status === 'computing') ?? false;
  return (
    <div className="space-y-3 text-sm">
      {publications.data && publications.data.length === 0 && (
        <p className="text-slate-600">Not published yet.</p>
      )}
      {publications.data && publications.data.length > 0 && (
        <ul className="space-y-2">
          {publications.data.map((p) => (
            <li key={p.id} className="rounded border border-sand-200 px-3 py-2">
              <span className="font-medium">{STATUS_WORDS[p.status]}</span>
              {p.publishedAt && <> · {new Date(p.publishedAt).toLocaleString('en-GB')}</>}
              {p.teamCount !== null && (
                <>
                  {' '}
                  · {p.teamCount} teams, {p.withheldTeamCount} withheld
                </>
              )}
              {p.withdrawnReason && <p className="mt-1 text-slate-700">{p.withdrawnReason}</p>}
            </li>
          ))}
        </ul>
      )}
      {canPublish && publicationState === 'requested' && (
        <Button
          busy={publish.isPending || computing}
          onClick={() => publish.mutate({ runId }, { onSuccess: () => onPublished?.() })}
        >
          Publish team briefs
        </Button>
      )}
      {publish.isError && <ErrorNotice error={publish.error} title="The briefs were not published" />}
      {publications.isError && (
        <ErrorNotice error={publications.error} title="Publications could not be loaded" />
      )}
    </div>
  );
}
