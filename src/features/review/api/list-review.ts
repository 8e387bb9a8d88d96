import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { submissionListSchema, type SubmissionList } from '../../../../shared/contracts/submissions';
import { apiRequest, type QueryValue } from '../../../lib/api-client';

/** GET /api/submissions (editor): all submissions, filtered (status=pending for the queue). */
export function listReview(search: Record<string, QueryValue>, signal?: AbortSignal): Promise<SubmissionList> {
  return apiRequest('/api/submissions', { query: search, schema: submissionListSchema, signal });
}

/** Keys: ['submissions'], ['submissions', 'review', search], ['submissions', 'detail', id]. */
export const reviewKeys = {
  all: ['submissions'] as const,
  list: (search: Record<string, QueryValue>) => ['submissions', 'review', search] as const,
  detail: (id: number) => ['submissions', 'detail', id] as const,
};

export const reviewListQueryOptions = (search: Record<string, QueryValue>) =>
  queryOptions({
    queryKey: reviewKeys.list(search),
    queryFn: ({ signal }) => listReview(search, signal),
    placeholderData: keepPreviousData,
  });

export function useReviewList(search: Record<string, QueryValue>) {
  return useQuery(reviewListQueryOptions(search));
}
