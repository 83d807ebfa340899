import { Router } from 'express';
import { barcodeCodeParamsSchema, barcodeInputSchema, partBarcodeIdParamsSchema, partBarcodeParamsSchema } from '@tappet/contracts';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { BarcodesService } from './barcodes.service';

/**
 * Supplier barcodes. Mounted at /api/shops/:shopId/parts/:partId/barcodes (list, attach, detach:
 * whoever may update parts attaches and detaches) and /api/shops/:shopId/barcodes/:code (find the
 * part a scan names: whoever may read parts).
 */
export function partBarcodesRouter(deps: { barcodes: BarcodesService }): Router {
  const router = Router({ mergeParams: true });
  router.get('/', validate({ params: partBarcodeParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await deps.barcodes.list(shopOf(req).shop.id, req.params['partId'] as string));
  });
  router.post('/', validate({ params: partBarcodeParamsSchema, body: barcodeInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Part');
    res.status(201).json(await deps.barcodes.attach(shopOf(req).shop.id, req.params['partId'] as string, bodyOf(barcodeInputSchema, req).code, auditActorOf(req)));
  });
  router.delete('/:barcodeId', validate({ params: partBarcodeIdParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Part');
    await deps.barcodes.detach(shopOf(req).shop.id, req.params['partId'] as string, req.params['barcodeId'] as string, auditActorOf(req));
    res.status(204).end();
  });
  return router;
}

export function barcodeLookupRouter(deps: { barcodes: BarcodesService }): Router {
  const router = Router({ mergeParams: true });
  router.get('/:code', validate({ params: barcodeCodeParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await deps.barcodes.find(shopOf(req).shop.id, req.params['code'] as string));
  });
  return router;
}
