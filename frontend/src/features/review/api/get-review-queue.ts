import { queryOptions, useQuery } from '@tanstack/react-query';
import { type ReviewQueueItem, reviewQueueSchema } from '../../../../../shared/privacy';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './review-keys';

export function getReviewQueue(): Promise<ReviewQueueItem[]> {
  return api.get('/api/review-queue', { schema: reviewQueueSchema });
}

// Decisions are taken on other pages (a dataset's review, a model run's publication), so the queue
// is read afresh each time it is opened.
export const reviewQueueQueryOptions = () =>
  queryOptions({ queryKey: reviewKeys.queue(), queryFn: getReviewQueue, staleTime: 0 });

export function useReviewQueue() {
  return useQuery(reviewQueueQueryOptions());
}
