import type { CountLabelsRequest } from '@tappet/contracts';
import { useMutation } from '@tanstack/react-query';
import { env } from '../../../config/env';
import { ApiError, errorFromResponse } from '../../../lib/api-client';

/** A label PDF as received. */
export interface CountLabelFile {
  blob: Blob;
  fileName: string;
  labels: number;
}

/** POST /api/shops/:shopId/labels/counts/:countId: the count's bin labels as a PDF (a file, so not through `api`). */
export async function printCountLabels(shopId: string, countId: string, request: CountLabelsRequest): Promise<CountLabelFile> {
  let response: Response;
  try {
    response = await fetch(`${env.apiBaseUrl}/shops/${encodeURIComponent(shopId)}/labels/counts/${encodeURIComponent(countId)}`, {
      method: 'POST',
      headers: { Accept: 'application/pdf', 'Content-Type': 'application/json', 'X-CSRF': '1' },
      body: JSON.stringify(request),
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'network', 'Tappet cannot be reached. Check the connection and try again.');
  }
  if (!response.ok) throw await errorFromResponse(response);
  const fileName = /filename="([^"]+)"/.exec(response.headers.get('Content-Disposition') ?? '')?.[1] ?? 'count-labels.pdf';
  return { blob: await response.blob(), fileName, labels: Number(response.headers.get('X-Label-Count') ?? 0) };
}

/** Printing changes nothing, so nothing is invalidated. */
export function usePrintCountLabels(shopId: string, countId: string) {
  return useMutation({ mutationFn: (request: CountLabelsRequest) => printCountLabels(shopId, countId, request) });
}
