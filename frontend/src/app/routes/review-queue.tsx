import type { DatasetQueueItem, PublicationQueueItem } from '../../../../shared/privacy';
import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { useReviewQueue } from '../../features/review/api/get-review-queue';
import { PublicationRequestsTable } from '../../features/review/components/publication-requests-table';
import { ReviewQueueTable } from '../../features/review/components/review-queue-table';

export function ReviewQueueRoute() {
  const queue = useReviewQueue();
  const datasets = queue.data?.filter((item): item is DatasetQueueItem => item.kind === 'dataset') ?? [];
  const publications =
    queue.data?.filter((item): item is PublicationQueueItem => item.kind === 'publication') ?? [];
  return (
    <>
      <PageHeader
        title="Review queue"
        description="What waits for a privacy officer: mapped datasets to approve for modelling (approved ones come back when the privacy policy changes in a way that matters to them), and model runs an analyst asked to publish to the managers."
      />
      {queue.isError && <ErrorNotice error={queue.error} title="The review queue could not be loaded" />}
      {queue.isPending && <p className="text-slate-600">Loading…</p>}
      {queue.data && (
        <div className="space-y-6">
          <Card title={`Datasets awaiting approval (${datasets.length})`}>
            <ReviewQueueTable items={datasets} hrefOf={(item) => paths.datasetReview.href(item.id)} />
          </Card>
          <Card title={`Publication requests (${publications.length})`}>
            <p className="mb-3 text-sm text-slate-700">
              Open a run to read its drivers, suggested actions and what would be withheld, then publish its
              team briefs or send it back with a comment.
            </p>
            <PublicationRequestsTable items={publications} hrefOf={(item) => paths.modelRun.href(item.id)} />
          </Card>
        </div>
      )}
    </>
  );
}
