import { importResultSchema, type ImportResult, type importKinds } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { env } from '../../../config/env';
import { api, ApiError, errorFromResponse } from '../../../lib/api-client';
import { catalogueKey, shopApi } from './keys';

export type ImportKind = (typeof importKinds)[number];
export type ImportMode = 'preview' | 'commit';

export interface ImportRequest {
  file: File;
  kind: ImportKind;
  mode: ImportMode;
}

/** Files at least this large are sent with upload progress (XMLHttpRequest); smaller ones with fetch. */
export const progressThresholdBytes = 256 * 1024;

/** How far an upload is: bytes sent of the total. */
export interface UploadProgress {
  loaded: number;
  total: number;
}

function formOf({ file, kind, mode }: ImportRequest): FormData {
  const form = new FormData();
  // Fields before the file, so the server knows what it is reading before the upload streams in.
  form.append('kind', kind);
  form.append('mode', mode);
  form.append('file', file, file.name);
  return form;
}

/**
 * Sends a form with XMLHttpRequest, which (unlike fetch) reports upload progress. Same headers,
 * errors and response check as the API client.
 */
function sendWithProgress(path: string, form: FormData, onProgress: (p: UploadProgress) => void): Promise<ImportResult> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `${env.apiBaseUrl}${path}`);
    xhr.setRequestHeader('X-CSRF', '1');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress({ loaded: event.loaded, total: event.total });
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'Tappet cannot be reached. Check the connection and try again.'));
    xhr.onload = () => {
      const response = new Response(xhr.responseText || null, { status: xhr.status, headers: { 'Content-Type': 'application/json' } });
      if (xhr.status < 200 || xhr.status >= 300) {
        void errorFromResponse(response).then(reject, reject);
        return;
      }
      let data: unknown;
      try {
        data = JSON.parse(xhr.responseText);
      } catch {
        data = undefined;
      }
      const checked = importResultSchema.safeParse(data);
      if (checked.success) resolve(checked.data);
      else reject(new ApiError(xhr.status, 'unexpected_response', 'Tappet answered in a way this page does not understand. Reload the page.'));
    };
    xhr.send(form);
  });
}

/**
 * POST /api/shops/:shopId/imports (multipart): checks (`preview`) or imports (`commit`) a CSV
 * file. Large files report their upload progress through `onProgress`.
 */
export function importFile(shopId: string, request: ImportRequest, onProgress?: (p: UploadProgress) => void): Promise<ImportResult> {
  const path = `${shopApi(shopId)}/imports`;
  if (onProgress && request.file.size >= progressThresholdBytes && typeof XMLHttpRequest !== 'undefined') {
    return sendWithProgress(path, formOf(request), onProgress);
  }
  return api.post(path, formOf(request), { schema: importResultSchema });
}

/** Sends a file; a committed import refreshes the catalogue. */
export function useImportFile(shopId: string, onProgress?: (p: UploadProgress) => void) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (request: ImportRequest) => importFile(shopId, request, onProgress),
    onSuccess: async (result) => {
      if (result.committed) await queryClient.invalidateQueries({ queryKey: catalogueKey(shopId) });
    },
  });
}

/** Where the CSV exports are downloaded from (same format as the imports). */
export function exportHref(apiBaseUrl: string, shopId: string, kind: ImportKind): string {
  return `${apiBaseUrl}${shopApi(shopId)}/exports/${kind}.csv`;
}
