import { Router, type Request } from 'express';
import {
  stockAdjustmentInputSchema,
  binIdParamsSchema,
  binInputSchema,
  binUpdateSchema,
  stockCountInputSchema,
  holdIdParamsSchema,
  holdInputSchema,
  holdListQuerySchema,
  stockIssueInputSchema,
  stockMoveInputSchema,
  movementListQuerySchema,
  stockReceiptInputSchema,
  stockReturnInputSchema,
  shopIdParamsSchema,
  stockListQuerySchema,
  stockPartParamsSchema,
  valueHistoryQuerySchema,
} from '@tappet/contracts';
import type { z } from 'zod';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { AuditActor } from '../audit/audit.service';
import type { StockService } from './stock.service';

const actorOf = (req: Request): AuditActor => {
  const { userId, apiKeyId, ip } = auditActorOf(req);
  return { userId, apiKeyId, ip };
};
const shopId = (req: Request) => shopOf(req).shop.id;
const queryOf = <S extends z.ZodType>(_schema: S, req: Request) => req.query as unknown as z.output<S>;

/**
 * /api/shops/:shopId/stock: bins, stock lines, the movement ledger, holds, a part's stock and the
 * stock value. Everyone in the shop reads; each kind of movement needs its own ability
 * (libs/permissions: mechanics hold and issue, buyers receive and move, owners everything).
 * Mounted behind requireAuth and tenantContext.
 */
export function stockRouter(deps: { stock: StockService }): Router {
  const { stock } = deps;
  const router = Router({ mergeParams: true });

  router.get('/', validate({ params: shopIdParamsSchema, query: stockListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Stock');
    const query = queryOf(stockListQuerySchema, req);
    res.json({ ...(await stock.list(shopId(req), query)), page: query.page, pageSize: query.pageSize });
  });

  router.get('/bins', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Bin');
    res.json({ bins: await stock.bins(shopId(req)) });
  });

  router.post('/bins', validate({ params: shopIdParamsSchema, body: binInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Bin');
    res.status(201).json(await stock.createBin(shopId(req), bodyOf(binInputSchema, req), actorOf(req)));
  });

  router.patch('/bins/:binId', validate({ params: binIdParamsSchema, body: binUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Bin');
    res.json(await stock.updateBin(shopId(req), req.params['binId'] as string, bodyOf(binUpdateSchema, req), actorOf(req)));
  });

  router.get('/movements', validate({ params: shopIdParamsSchema, query: movementListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Stock');
    const query = queryOf(movementListQuerySchema, req);
    res.json({ ...(await stock.movements(shopId(req), query)), page: query.page, pageSize: query.pageSize });
  });

  router.post('/receipts', validate({ params: shopIdParamsSchema, body: stockReceiptInputSchema }), async (req, res) => {
    authorize(req, 'receive', 'Stock');
    res.status(201).json(await stock.receive(shopId(req), bodyOf(stockReceiptInputSchema, req), actorOf(req)));
  });

  router.post('/issues', validate({ params: shopIdParamsSchema, body: stockIssueInputSchema }), async (req, res) => {
    authorize(req, 'issue', 'Stock');
    res.status(201).json(await stock.issue(shopId(req), bodyOf(stockIssueInputSchema, req), actorOf(req)));
  });

  // A return undoes an issue: whoever may issue may bring parts back from the job.
  router.post('/returns', validate({ params: shopIdParamsSchema, body: stockReturnInputSchema }), async (req, res) => {
    authorize(req, 'issue', 'Stock');
    res.status(201).json(await stock.returnToStock(shopId(req), bodyOf(stockReturnInputSchema, req), actorOf(req)));
  });

  router.post('/adjustments', validate({ params: shopIdParamsSchema, body: stockAdjustmentInputSchema }), async (req, res) => {
    authorize(req, 'adjust', 'Stock');
    res.status(201).json(await stock.adjust(shopId(req), bodyOf(stockAdjustmentInputSchema, req), actorOf(req)));
  });

  router.post('/moves', validate({ params: shopIdParamsSchema, body: stockMoveInputSchema }), async (req, res) => {
    authorize(req, 'move', 'Stock');
    res.status(201).json(await stock.move(shopId(req), bodyOf(stockMoveInputSchema, req), actorOf(req)));
  });

  router.post('/counts', validate({ params: shopIdParamsSchema, body: stockCountInputSchema }), async (req, res) => {
    authorize(req, 'count', 'Stock');
    res.status(201).json(await stock.count(shopId(req), bodyOf(stockCountInputSchema, req), actorOf(req)));
  });

  router.get('/holds', validate({ params: shopIdParamsSchema, query: holdListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Stock');
    res.json(await stock.holds(shopId(req), queryOf(holdListQuerySchema, req)));
  });

  router.post('/holds', validate({ params: shopIdParamsSchema, body: holdInputSchema }), async (req, res) => {
    authorize(req, 'hold', 'Stock');
    res.status(201).json(await stock.hold(shopId(req), bodyOf(holdInputSchema, req), actorOf(req)));
  });

  router.post('/holds/:holdId/release', validate({ params: holdIdParamsSchema }), async (req, res) => {
    authorize(req, 'hold', 'Stock');
    res.json(await stock.release(shopId(req), req.params['holdId'] as string, actorOf(req)));
  });

  router.get('/parts/:partId', validate({ params: stockPartParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Stock');
    res.json(await stock.partStock(shopId(req), req.params['partId'] as string));
  });

  router.get('/valuation', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Stock');
    res.json(await stock.valuation(shopId(req)));
  });

  router.get('/valuation/history', validate({ params: shopIdParamsSchema, query: valueHistoryQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Stock');
    res.json(await stock.history(shopId(req), queryOf(valueHistoryQuerySchema, req).months));
  });

  router.get('/valuation.csv', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Stock');
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', 'attachment; filename="stock-value.csv"');
    res.send(await stock.valuationCsv(shopId(req)));
  });

  return router;
}
