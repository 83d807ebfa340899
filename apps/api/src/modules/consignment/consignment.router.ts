import { Router, type Request } from 'express';
import { consignmentTermsInputSchema, consignmentVehicleParamsSchema, payoutInputSchema, settlementInputSchema, shopIdParamsSchema } from '@tappet/contracts';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import { contentDisposition } from '../vehicles/vehicles.router';
import type { ConsignmentService } from './consignment.service';

const shopIdOf = (req: Request) => shopOf(req).shop.id;
const vehicleIdOf = (req: Request) => req.params['vehicleId'] as string;

/**
 * /api/shops/:shopId/consignment (behind requireAuth and tenantContext): owners agree terms,
 * settle and record payouts; buyers and viewers read. Mechanics see no consignment figures.
 */
export function consignmentRouter(deps: { consignment: ConsignmentService }): Router {
  const { consignment } = deps;
  const router = Router({ mergeParams: true });
  router.get('/vehicles', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Consignment');
    res.json({ vehicles: await consignment.list(shopIdOf(req)) });
  });
  router.get('/vehicles/:vehicleId', validate({ params: consignmentVehicleParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Consignment');
    res.json(await consignment.get(shopIdOf(req), vehicleIdOf(req)));
  });
  router.put('/vehicles/:vehicleId/terms', validate({ params: consignmentVehicleParamsSchema, body: consignmentTermsInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Consignment');
    res.json(await consignment.setTerms(shopIdOf(req), vehicleIdOf(req), bodyOf(consignmentTermsInputSchema, req), auditActorOf(req)));
  });
  router.post('/vehicles/:vehicleId/settlement', validate({ params: consignmentVehicleParamsSchema, body: settlementInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Consignment');
    res.status(201).json(await consignment.settle(shopIdOf(req), vehicleIdOf(req), bodyOf(settlementInputSchema, req), auditActorOf(req)));
  });
  router.post('/vehicles/:vehicleId/settlement/payout', validate({ params: consignmentVehicleParamsSchema, body: payoutInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Consignment');
    res.json(await consignment.recordPayout(shopIdOf(req), vehicleIdOf(req), bodyOf(payoutInputSchema, req), auditActorOf(req)));
  });
  router.get('/vehicles/:vehicleId/settlement/pdf', validate({ params: consignmentVehicleParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Consignment');
    const pdf = await consignment.pdf(shopIdOf(req), vehicleIdOf(req));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', contentDisposition('inline', pdf.filename));
    res.send(pdf.content);
  });
  return router;
}
