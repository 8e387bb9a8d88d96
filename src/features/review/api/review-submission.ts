import { bulkResultSchema, submissionSchema, type Submission } from '../../../../shared/contracts/submissions';
import { stockKeys } from '../../../api/stock';
import { submissionKeys } from '../../../api/submissions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

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
const reviewedKeys = [submissionKeys.all, stockKeys.all];

export function useReviewSubmission() {
  return useInvalidatingMutation(reviewSubmission, reviewedKeys, { after: 'success' });
}

export function useBulkReview() {
  return useInvalidatingMutation(bulkReview, reviewedKeys, { after: 'success' });
}
