import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { z } from 'zod';
import { uploadJobSchema, type UploadJob } from '../../../../shared/contracts/submissions';
import { submissionKeys } from '../../../api/submissions';
import { ApiError, apiRequest } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

export interface UploadProgress {
  loaded: number;
  total: number;
}

const envelope = z.object({ error: z.object({ code: z.string(), message: z.string(), details: z.unknown().optional() }) });

/** Keys: ['uploads'] (all), ['uploads', id]. */
export const uploadKeys = {
  all: ['uploads'] as const,
  detail: (id: string) => [...uploadKeys.all, id] as const,
};

/**
 * POST /api/submissions/upload (setter, multipart field "file"). Uses XMLHttpRequest so the
 * page can show the bytes going up; the server answers at once (202) with the upload job that
 * checks and stores the lines, followed with useUpload(id).
 */
export function uploadSubmissions(file: File, onProgress?: (p: UploadProgress) => void): Promise<UploadJob> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/submissions/upload');
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (e) => onProgress?.({ loaded: e.loaded, total: e.lengthComputable ? e.total : file.size });
    xhr.onerror = () => reject(new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.'));
    xhr.onload = () => {
      let json: unknown;
      try {
        json = JSON.parse(xhr.responseText);
      } catch {
        json = undefined;
      }
      if (xhr.status < 200 || xhr.status >= 300) {
        const e = envelope.safeParse(json);
        reject(e.success ? new ApiError(xhr.status, e.data.error.code, e.data.error.message, e.data.error.details) : new ApiError(xhr.status, `http_${xhr.status}`, `The server answered ${xhr.status}`));
        return;
      }
      const parsed = uploadJobSchema.safeParse(json);
      if (!parsed.success) reject(new ApiError(xhr.status, 'bad_response', `Unexpected answer: ${z.prettifyError(parsed.error)}`));
      else resolve(parsed.data);
    };
    const form = new FormData();
    form.append('file', file);
    xhr.send(form);
  });
}

export function useUploadSubmissions(onProgress?: (p: UploadProgress) => void) {
  return useInvalidatingMutation((file: File) => uploadSubmissions(file, onProgress), [submissionKeys.all], { after: 'success' });
}

export const isUploadActive = (u: Pick<UploadJob, 'state'>) => u.state === 'queued' || u.state === 'running';

/** GET /api/submissions/uploads/:id: state, progress, counts; the report once it has ended. */
export function getUpload(id: string, signal?: AbortSignal) {
  return apiRequest(`/api/submissions/uploads/${encodeURIComponent(id)}`, { schema: uploadJobSchema, signal });
}

export const uploadQueryOptions = (id: string) =>
  queryOptions({
    queryKey: uploadKeys.detail(id),
    queryFn: ({ signal }) => getUpload(id, signal),
    refetchInterval: (q) => (q.state.data && isUploadActive(q.state.data) ? 500 : false),
  });

/** Follows an upload while it runs; when it ends, the submission lists are fetched again. */
export function useUpload(id: string | null) {
  const q = useQuery({ ...uploadQueryOptions(id ?? ''), enabled: id !== null });
  const queryClient = useQueryClient();
  const ended = q.data !== undefined && !isUploadActive(q.data);
  useEffect(() => {
    if (ended) void queryClient.invalidateQueries({ queryKey: submissionKeys.all });
  }, [ended, queryClient]);
  return q;
}

/** POST /api/submissions/uploads/:id/cancel: stops within 2 s; what was stored stays. */
export function cancelUpload(id: string) {
  return apiRequest(`/api/submissions/uploads/${encodeURIComponent(id)}/cancel`, { method: 'POST', schema: uploadJobSchema });
}

/** POST /api/submissions/uploads/:id/retry: resume (stored lines skipped) or restart. */
export function retryUpload({ id, how }: { id: string; how: 'resume' | 'restart' }) {
  return apiRequest(`/api/submissions/uploads/${encodeURIComponent(id)}/retry`, { method: 'POST', body: { how }, schema: uploadJobSchema });
}

export function useCancelUpload() {
  return useInvalidatingMutation(cancelUpload, [uploadKeys.all, submissionKeys.all]);
}

export function useRetryUpload() {
  return useInvalidatingMutation(retryUpload, [uploadKeys.all]);
}
