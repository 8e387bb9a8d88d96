import { z } from 'zod';
import { uploadReportSchema, type UploadReport } from '../../../../shared/contracts/submissions';
import { submissionKeys } from '../../../api/submissions';
import { ApiError } from '../../../lib/api-client';
import { useInvalidatingMutation } from '../../../lib/use-invalidating-mutation';

export interface UploadProgress {
  phase: 'uploading' | 'checking';
  loaded: number;
  total: number;
}

const envelope = z.object({ error: z.object({ code: z.string(), message: z.string(), details: z.unknown().optional() }) });

/**
 * POST /api/submissions/upload (setter, multipart field "file"). Uses XMLHttpRequest so the
 * page can show upload progress; the answer is parsed with the contract like every fetcher.
 */
export function uploadSubmissions(file: File, onProgress?: (p: UploadProgress) => void): Promise<UploadReport> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/submissions/upload');
    xhr.withCredentials = true;
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (e) => onProgress?.({ phase: 'uploading', loaded: e.loaded, total: e.lengthComputable ? e.total : file.size });
    xhr.upload.onload = () => onProgress?.({ phase: 'checking', loaded: file.size, total: file.size });
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
      const parsed = uploadReportSchema.safeParse(json);
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
