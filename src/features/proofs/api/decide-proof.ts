import { printerEditionSchema } from '../../../../shared/contracts/editions';
import { editionKeys } from '../../../api/editions';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

/** POST /api/editions/:id/proofs/:version/approve (printer). */
export function approveProof(id: string, version: number) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/proofs/${version}/approve`, { method: 'POST', schema: printerEditionSchema });
}

/** POST /api/editions/:id/proofs/:version/return (printer), with notes. */
export function returnProof(id: string, version: number, notes: string) {
  return apiRequest(`/api/editions/${encodeURIComponent(id)}/proofs/${version}/return`, { method: 'POST', body: { notes }, schema: printerEditionSchema });
}

export function useApproveProof(id: string) {
  return useInvalidatingMutation((version: number) => approveProof(id, version), [editionKeys.all]);
}

export function useReturnProof(id: string) {
  return useInvalidatingMutation((v: { version: number; notes: string }) => returnProof(id, v.version, v.notes), [editionKeys.all]);
}
