import { queryOptions, useQuery } from '@tanstack/react-query';
import { type ReviewQueueItem, reviewQueueSchema } from '../../../../../shared/privacy';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './review-keys';

export function getReviewQueue(): Promise<ReviewQueueItem[]> {
  return api.get('/api/review-queue', { schema: reviewQueueSchema });
}

export const reviewQueueQueryOptions = () =>
  queryOptions({ queryKey: reviewKeys.queue(), queryFn: getReviewQueue });

export function useReviewQueue() {
  return useQuery(reviewQueueQueryOptions());
}
