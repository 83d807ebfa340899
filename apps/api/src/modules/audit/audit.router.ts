import { once } from 'node:events';
import { Router, type Response } from 'express';
import { auditEventCsvQuerySchema, auditEventQuerySchema, shopIdParamsSchema, type AuditEventQuery } from '@tappet/contracts';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { validate } from '../../middleware/validate';
import type { AuditFilters, AuditQueries } from './audit.query';

/** Writes an async sequence of text chunks to the response, waiting when the client is slow. */
export async function streamText(res: Response, chunks: AsyncIterable<string>): Promise<void> {
  for await (const chunk of chunks) {
    if (res.destroyed) return;
    if (!res.write(chunk)) await once(res, 'drain');
  }
  res.end();
}

/** /api/shops/:shopId/audit-events (behind the tenant context): the owner reads the log. */
export function auditRouter(deps: { audit: AuditQueries }): Router {
  const router = Router({ mergeParams: true });
  router.get('/', validate({ params: shopIdParamsSchema, query: auditEventQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'AuditLog');
    res.json(await deps.audit.list(shopOf(req).shop.id, req.query as unknown as AuditEventQuery));
  });
  return router;
}

/** /api/shops/:shopId/audit-events.csv: the same filters, streamed as CSV. */
export function auditCsvRouter(deps: { audit: AuditQueries }): Router {
  const router = Router({ mergeParams: true });
  router.get('/', validate({ params: shopIdParamsSchema, query: auditEventCsvQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'AuditLog');
    const { shop } = shopOf(req);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="audit-log-${shop.slug}.csv"`);
    await streamText(res, deps.audit.csv(shop.id, req.query as unknown as AuditFilters));
  });
  return router;
}
