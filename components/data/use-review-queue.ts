// The reviewer's queue: open proposals across the team's designs, without those from the
// reviewer's own scans.
import useSWR from 'swr';
import type { ReviewQueueResponse } from '@/shared/api/review';
import { REVIEW_QUEUE_KEY } from './workflow-keys';

export function useReviewQueue() {
  const { data, error, isLoading, mutate } = useSWR<ReviewQueueResponse>(REVIEW_QUEUE_KEY);
  return { queue: data?.proposals, error: error as unknown, isLoading, retry: () => mutate() };
}
