import { readerSettingsSchema, type ReaderSettings, type ReaderSettingsInput } from '../../../../shared/contracts/reader';
import { apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';
import { readerKeys } from './get-solve-stats';

/** PUT /api/reader/settings/:id (admin). */
export function updateReaderSettings({ publicationId, input }: { publicationId: string; input: ReaderSettingsInput }): Promise<ReaderSettings> {
  return apiRequest(`/api/reader/settings/${encodeURIComponent(publicationId)}`, { method: 'PUT', body: input, schema: readerSettingsSchema });
}

export function useUpdateReaderSettings() {
  return useInvalidatingMutation(updateReaderSettings, [readerKeys.all]);
}
