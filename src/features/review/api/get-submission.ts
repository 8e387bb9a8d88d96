import { queryOptions, useQuery } from '@tanstack/react-query';
import { submissionDetailSchema, type SubmissionDetail } from '../../../../shared/contracts/submissions';
import { submissionKeys } from '../../../api/submissions';
import { apiRequest } from '../../../lib/api-client';

/** GET /api/submissions/:id with drawing data, classification and duplicates. */
export function getSubmission(id: number, signal?: AbortSignal): Promise<SubmissionDetail> {
  return apiRequest(`/api/submissions/${id}`, { schema: submissionDetailSchema, signal });
}

export const submissionDetailQueryOptions = (id: number) =>
  queryOptions({ queryKey: submissionKeys.detail(id), queryFn: ({ signal }) => getSubmission(id, signal) });

export function useSubmissionDetail(id: number | null) {
  return useQuery({ ...submissionDetailQueryOptions(id ?? 0), enabled: id !== null });
}
