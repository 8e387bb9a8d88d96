import { queryOptions, useQuery } from '@tanstack/react-query';
import { readerSettingsListSchema, type ReaderSettingsList } from '../../../../shared/contracts/reader';
import { apiRequest } from '../../../lib/api-client';
import { readerKeys } from './get-solve-stats';

/** GET /api/reader/settings (editor): each publication's public address, time zone, release time and embed origins. */
export function getReaderSettings(signal?: AbortSignal): Promise<ReaderSettingsList> {
  return apiRequest('/api/reader/settings', { schema: readerSettingsListSchema, signal });
}

export const readerSettingsQueryOptions = () => queryOptions({ queryKey: readerKeys.settings(), queryFn: ({ signal }) => getReaderSettings(signal) });

export function useReaderSettings() {
  return useQuery(readerSettingsQueryOptions());
}
