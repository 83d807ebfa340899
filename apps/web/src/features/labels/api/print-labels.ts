import type { BinLabelsRequest, PartLabelsRequest, ReceiptLabelsRequest } from '@tappet/contracts';
import { useMutation } from '@tanstack/react-query';
import { env } from '../../../config/env';
import { ApiError, errorFromResponse } from '../../../lib/api-client';

/** What to print: chosen parts, chosen bins (optionally with their contents), or what receipts brought in. */
export type LabelRequest = ({ kind: 'parts' } & PartLabelsRequest) | ({ kind: 'bins' } & BinLabelsRequest) | ({ kind: 'receipts' } & ReceiptLabelsRequest);

/** A label PDF as received: the file, its name and the counts the API reports. */
export interface LabelFile {
  blob: Blob;
  fileName: string;
  labels: number;
  pages: number;
}

/**
 * POST /api/shops/:shopId/labels/{parts|bins|receipts}: the labels as a PDF. Not through `api` because
 * the answer is a file, not JSON; same headers (X-CSRF, JSON body) and the same errors.
 */
export async function printLabels(shopId: string, request: LabelRequest): Promise<LabelFile> {
  const { kind, ...body } = request;
  let response: Response;
  try {
    response = await fetch(`${env.apiBaseUrl}/shops/${encodeURIComponent(shopId)}/labels/${kind}`, {
      method: 'POST',
      headers: { Accept: 'application/pdf', 'Content-Type': 'application/json', 'X-CSRF': '1' },
      body: JSON.stringify(body),
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'network', 'Tappet cannot be reached. Check the connection and try again.');
  }
  if (!response.ok) throw await errorFromResponse(response);
  const disposition = response.headers.get('Content-Disposition') ?? '';
  const fileName = /filename="([^"]+)"/.exec(disposition)?.[1] ?? 'labels.pdf';
  return {
    blob: await response.blob(),
    fileName,
    labels: Number(response.headers.get('X-Label-Count') ?? 0),
    pages: Number(response.headers.get('X-Page-Count') ?? 0),
  };
}

/** Printing changes nothing, so nothing is invalidated. */
export function usePrintLabels(shopId: string) {
  return useMutation({ mutationFn: (request: LabelRequest) => printLabels(shopId, request) });
}
