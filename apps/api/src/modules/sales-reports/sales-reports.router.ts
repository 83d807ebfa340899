import { Router, type Request, type Response } from 'express';
import { salesReportQuerySchema, shopIdParamsSchema } from '@tappet/contracts';
import { subjectOf } from '@tappet/permissions';
import { forbidden } from '../../lib/http-error';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { validate } from '../../middleware/validate';
import type { ReportQuery, SalesReportsService } from './sales-reports.service';

const shopIdOf = (req: Request) => shopOf(req).shop.id;
const queryOf = (req: Request) => req.query as unknown as ReportQuery;
const sendCsv = (res: Response, name: string, text: string) => {
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${name}.csv"`);
  res.send(text);
};

/**
 * /api/shops/:shopId/sales-reports (behind requireAuth and tenantContext): owners, buyers and
 * viewers read sales by period and unpaid invoices; gross margins are the owner's alone.
 */
export function salesReportsRouter(deps: { reports: SalesReportsService }): Router {
  const { reports } = deps;
  const router = Router({ mergeParams: true });
  /** Margins: the field-level rule of the ability (owners only). */
  const margin = (req: Request) => {
    const { shop, ability } = shopOf(req);
    authorize(req, 'read', 'SalesReport');
    if (!ability.can('read', subjectOf('SalesReport', { shopId: shop.id }), 'margin')) throw forbidden('Only the owner sees gross margins.');
  };
  router.get('/sales', validate({ params: shopIdParamsSchema, query: salesReportQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'SalesReport');
    res.json(await reports.sales(shopIdOf(req), queryOf(req)));
  });
  router.get('/sales.csv', validate({ params: shopIdParamsSchema, query: salesReportQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'SalesReport');
    sendCsv(res, 'sales-by-period', await reports.salesCsv(shopIdOf(req), queryOf(req)));
  });
  router.get('/margins', validate({ params: shopIdParamsSchema, query: salesReportQuerySchema }), async (req, res) => {
    margin(req);
    res.json(await reports.margins(shopIdOf(req), queryOf(req)));
  });
  router.get('/margins.csv', validate({ params: shopIdParamsSchema, query: salesReportQuerySchema }), async (req, res) => {
    margin(req);
    sendCsv(res, 'gross-margin', await reports.marginsCsv(shopIdOf(req), queryOf(req)));
  });
  router.get('/unpaid', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'SalesReport');
    res.json(await reports.unpaid(shopIdOf(req)));
  });
  router.get('/unpaid.csv', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'SalesReport');
    sendCsv(res, 'unpaid-invoices', await reports.unpaidCsv(shopIdOf(req)));
  });
  return router;
}
