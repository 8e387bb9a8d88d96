import { useMutation, useQueryClient } from '@tanstack/react-query';
import { submissionSchema, type CreateSubmission, type Submission } from '../../../../shared/contracts/submissions';
import { submissionKeys } from '../../../api/submissions';
import { apiRequest } from '../../../lib/api-client';

/** POST /api/submissions (setter): one tiling by paste or sketch. */
export function createSubmission(input: CreateSubmission): Promise<Submission> {
  return apiRequest('/api/submissions', { method: 'POST', body: input, schema: submissionSchema });
}

export function useCreateSubmission() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createSubmission,
    onSuccess: () => qc.invalidateQueries({ queryKey: submissionKeys.all }),
  });
}
