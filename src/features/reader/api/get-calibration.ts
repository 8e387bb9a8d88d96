import { queryOptions, useQuery } from '@tanstack/react-query';
import { calibrationSchema, type Calibration } from '../../../../shared/contracts/reader';
import { apiRequest } from '../../../lib/api-client';
import { readerKeys } from './get-solve-stats';

/** GET /api/reader/calibration (editor): engine grade against readers' times, suggested boundaries and formula. */
export function getCalibration(signal?: AbortSignal): Promise<Calibration> {
  return apiRequest('/api/reader/calibration', { schema: calibrationSchema, signal });
}

export const calibrationQueryOptions = () => queryOptions({ queryKey: readerKeys.calibration(), queryFn: ({ signal }) => getCalibration(signal) });

export function useCalibration() {
  return useQuery(calibrationQueryOptions());
}
