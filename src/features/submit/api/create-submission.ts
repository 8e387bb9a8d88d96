import { submissionSchema, type CreateSubmission, type Submission } from '../../../../shared/contracts/submissions';
import { submissionKeys } from '../../../api/submissions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/submissions (setter): one tiling by paste or sketch. */
export function createSubmission(input: CreateSubmission): Promise<Submission> {
  return apiRequest('/api/submissions', { method: 'POST', body: input, schema: submissionSchema });
}

export function useCreateSubmission() {
  return useInvalidatingMutation(createSubmission, [submissionKeys.all], { after: 'success' });
}
