import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { bulkResultSchema, submissionSchema, type Submission } from '../../../../shared/contracts/submissions';
import { stockKeys } from '../../../api/stock';
import { submissionKeys } from '../../../api/submissions';
import { apiRequest } from '../../../lib/api-client';

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

/** A decision changes the submission lists and details, and (on accept) the stock. */
function invalidateAfterReview(qc: QueryClient) {
  return Promise.all([qc.invalidateQueries({ queryKey: submissionKeys.all }), qc.invalidateQueries({ queryKey: stockKeys.all })]);
}

export function useReviewSubmission() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: reviewSubmission,
    onSuccess: () => invalidateAfterReview(qc),
  });
}

export function useBulkReview() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: bulkReview,
    onSuccess: () => invalidateAfterReview(qc),
  });
}
