import { gradeAdjustmentSchema, type GradeAdjustInput, type GradeAdjustment } from '../../../../shared/contracts/reader';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { readerKeys } from './get-solve-stats';

/** PUT /api/reader/puzzles/:id/grade (editor): the grade readers see, with a note. */
export function adjustGrade({ puzzleId, input }: { puzzleId: number; input: GradeAdjustInput }): Promise<GradeAdjustment> {
  return apiRequest(`/api/reader/puzzles/${puzzleId}/grade`, { method: 'PUT', body: input, schema: gradeAdjustmentSchema });
}

export function useAdjustGrade() {
  return useInvalidatingMutation(adjustGrade, [readerKeys.all], { after: 'success' });
}
