import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { submissionListSchema, type SubmissionList } from '../../shared/contracts/submissions';
import { apiRequest, type QueryValue } from '../lib/api-client';

// Submissions are listed by the submissions feature (a setter's own) and the review feature
// (an editor's queue), and created by the submit feature: all of them use submissionKeys.

/** Keys: ['submissions'] (all), ['submissions', 'list', search], ['submissions', 'detail', id]. */
export const submissionKeys = {
  all: ['submissions'] as const,
  lists: () => [...submissionKeys.all, 'list'] as const,
  list: (search: Record<string, QueryValue>) => [...submissionKeys.lists(), search] as const,
  detail: (id: number) => [...submissionKeys.all, 'detail', id] as const,
};

/** GET /api/submissions: a setter gets their own submissions, an editor everyone's; filtered, sorted and paged. */
export function listSubmissions(search: Record<string, QueryValue>, signal?: AbortSignal): Promise<SubmissionList> {
  return apiRequest('/api/submissions', { query: search, schema: submissionListSchema, signal });
}

export const submissionListQueryOptions = (search: Record<string, QueryValue>) =>
  queryOptions({
    queryKey: submissionKeys.list(search),
    queryFn: ({ signal }) => listSubmissions(search, signal),
    placeholderData: keepPreviousData,
  });

export function useSubmissionList(search: Record<string, QueryValue>) {
  return useQuery(submissionListQueryOptions(search));
}
