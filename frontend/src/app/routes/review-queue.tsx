import { Card } from '../../components/card';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { useReviewQueue } from '../../features/review/api/get-review-queue';
import { ReviewQueueTable } from '../../features/review/components/review-queue-table';

export function ReviewQueueRoute() {
  const queue = useReviewQueue();
  return (
    <>
      <PageHeader
        title="Review queue"
        description="Mapped datasets wait here until a privacy officer approves them for modelling; approved ones come back when the privacy policy changes in a way that matters to them."
      />
      {queue.isError && <ErrorNotice error={queue.error} title="The review queue could not be loaded" />}
      {queue.isPending && <p className="text-slate-600">Loading…</p>}
      {queue.data && (
        <Card>
          <ReviewQueueTable items={queue.data} hrefOf={(item) => paths.datasetReview.href(item.id)} />
        </Card>
      )}
    </>
  );
}
