import { Router } from 'express';
import { customerIdParamsSchema, customerInputSchema, customerListQuerySchema, customerUpdateSchema, shopIdParamsSchema } from '@tappet/contracts';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { CustomerListQuery, CustomersService } from './customers.service';

/**
 * /api/shops/:shopId/customers (mounted behind requireAuth and tenantContext). Everyone in the
 * shop reads; creating and changing customers needs the `Customer` abilities (the owner).
 */
export function customersRouter(deps: { customers: CustomersService }): Router {
  const { customers } = deps;
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema, query: customerListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Customer');
    res.json(await customers.list(shopOf(req).shop.id, req.query as unknown as CustomerListQuery));
  });

  router.post('/', validate({ params: shopIdParamsSchema, body: customerInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Customer');
    res.status(201).json(await customers.create(shopOf(req).shop.id, bodyOf(customerInputSchema, req), auditActorOf(req)));
  });

  router.get('/:customerId', validate({ params: customerIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Customer');
    res.json(await customers.get(shopOf(req).shop.id, req.params['customerId'] as string));
  });

  router.patch('/:customerId', validate({ params: customerIdParamsSchema, body: customerUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Customer');
    res.json(await customers.update(shopOf(req).shop.id, req.params['customerId'] as string, bodyOf(customerUpdateSchema, req), auditActorOf(req)));
  });

  return router;
}
