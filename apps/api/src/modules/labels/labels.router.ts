import { Router, type Response } from 'express';
import { binLabelsRequestSchema, countIdParamsSchema, countLabelsRequestSchema, labelPdfMediaType, partLabelsRequestSchema, receiptLabelsRequestSchema, shopIdParamsSchema } from '@tappet/contracts';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { LabelPdf, LabelsService } from './labels.service';

function sendPdf(res: Response, pdf: LabelPdf, name: string) {
  res.setHeader('Content-Type', labelPdfMediaType);
  // Inline, so a browser tab shows it; the name is ours (no user text in the header).
  res.setHeader('Content-Disposition', `inline; filename="${name}-${pdf.format}.pdf"`);
  res.setHeader('X-Label-Count', String(pdf.labels));
  res.setHeader('X-Page-Count', String(pdf.pages));
  res.end(Buffer.from(pdf.bytes));
}

/**
 * /api/shops/:shopId/labels (behind the tenant context): label sheets as PDF. Printing is a read:
 * whoever may read parts (bins) may print their labels; nothing is written, so nothing is audited.
 */
export function labelsRouter(deps: { labels: LabelsService }): Router {
  const router = Router({ mergeParams: true });

  router.get('/options', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await deps.labels.options(shopOf(req).shop.id));
  });

  // POST because a selection of up to 200 ids does not belong in a URL; it changes nothing.
  router.post('/parts', validate({ params: shopIdParamsSchema, body: partLabelsRequestSchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    sendPdf(res, await deps.labels.partLabels(shopOf(req).shop.id, bodyOf(partLabelsRequestSchema, req)), 'part-labels');
  });

  router.post('/bins', validate({ params: shopIdParamsSchema, body: binLabelsRequestSchema }), async (req, res) => {
    const body = bodyOf(binLabelsRequestSchema, req);
    authorize(req, 'read', 'Bin');
    if (body.contents) authorize(req, 'read', 'Part');
    sendPdf(res, await deps.labels.binLabels(shopOf(req).shop.id, body), 'bin-labels');
  });

  // Labels for the bins of a stock count (issue 7): whoever may read counts and bins.
  router.post('/counts/:countId', validate({ params: countIdParamsSchema, body: countLabelsRequestSchema }), async (req, res) => {
    const body = bodyOf(countLabelsRequestSchema, req);
    authorize(req, 'read', 'StockCount');
    authorize(req, 'read', 'Bin');
    if (body.contents) authorize(req, 'read', 'Part');
    sendPdf(res, await deps.labels.countLabels(shopOf(req).shop.id, req.params['countId'] as string, body), 'count-labels');
  });

  // Labels for what arrived on purchase receipts: one per unit received, or one per receipt.
  router.post('/receipts', validate({ params: shopIdParamsSchema, body: receiptLabelsRequestSchema }), async (req, res) => {
    authorize(req, 'read', 'PurchaseOrder');
    authorize(req, 'read', 'Part');
    sendPdf(res, await deps.labels.receiptLabels(shopOf(req).shop.id, bodyOf(receiptLabelsRequestSchema, req)), 'receipt-labels');
  });

  return router;
}
