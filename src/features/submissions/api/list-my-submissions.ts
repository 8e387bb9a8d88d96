import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { submissionListSchema, type SubmissionList } from '../../../../shared/contracts/submissions';
import { apiRequest, type QueryValue } from '../../../lib/api-client';

/** GET /api/submissions: for a setter, their own submissions. */
export function listMySubmissions(search: Record<string, QueryValue>, signal?: AbortSignal): Promise<SubmissionList> {
  return apiRequest('/api/submissions', { query: search, schema: submissionListSchema, signal });
}

/** Keys: ['submissions'], ['submissions', 'mine', search]. */
export const mySubmissionsKeys = { all: ['submissions'] as const };

export const mySubmissionsQueryOptions = (search: Record<string, QueryValue>) =>
  queryOptions({
    queryKey: [...mySubmissionsKeys.all, 'mine', search] as const,
    queryFn: ({ signal }) => listMySubmissions(search, signal),
    placeholderData: keepPreviousData,
  });

export function useMySubmissions(search: Record<string, QueryValue>) {
  return useQuery(mySubmissionsQueryOptions(search));
}
