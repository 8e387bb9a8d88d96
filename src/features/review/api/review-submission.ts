import { useMutation, useQueryClient } from '@tanstack/react-query';
import { bulkResultSchema, submissionSchema, type Submission } from '../../../../shared/contracts/submissions';
import { apiRequest } from '../../../lib/api-client';
import { reviewKeys } from './list-review';

/** POST /api/submissions/:id/accept | /reject (editor). */
export function reviewSubmission(input: { id: number; action: 'accept' | 'reject'; note?: string }): Promise<Submission> {
  return apiRequest(`/api/submissions/${input.id}/${input.action}`, {
    method: 'POST',
    body: input.note ? { note: input.note } : {},
    schema: submissionSchema,
  });
}

/** POST /api/submissions/bulk (editor). */
export function bulkReview(input: { ids: number[]; action: 'accept' | 'reject'; note?: string }) {
  return apiRequest('/api/submissions/bulk', { method: 'POST', body: input, schema: bulkResultSchema });
}

export function useReviewSubmission() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: reviewSubmission,
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: reviewKeys.all }), qc.invalidateQueries({ queryKey: ['stock'] })]),
  });
}

export function useBulkReview() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: bulkReview,
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: reviewKeys.all }), qc.invalidateQueries({ queryKey: ['stock'] })]),
  });
}
