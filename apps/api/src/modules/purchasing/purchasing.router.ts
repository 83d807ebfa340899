import { Router, type Request } from 'express';
import {
  creditInputSchema,
  listingIdParamsSchema,
  listingImportFieldsSchema,
  listingInputSchema,
  listingUpdateSchema,
  orderFromReorderSchema,
  orderIdParamsSchema,
  orderInputSchema,
  orderUpdateSchema,
  partPurchasingSchema,
  purchaseOrderListQuerySchema,
  purchasingPartParamsSchema,
  purchasingSettingsUpdateSchema,
  reasonBodySchema,
  receiptInputSchema,
  returnIdParamsSchema,
  shopIdParamsSchema,
  supplierIdParamsSchema,
  supplierInputSchema,
  supplierReturnInputSchema,
  supplierUpdateSchema,
  type PurchaseOrderStatus,
} from '@tappet/contracts';
import { subjectOf } from '@tappet/permissions';
import { badRequest } from '../../lib/http-error';
import { csvUpload } from '../uploads/upload-middleware';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { ListingsImportService } from './listings-import.service';
import type { OrdersService } from './orders.service';
import type { ReorderService } from './reorder.service';
import type { ReturnsService } from './returns.service';
import type { SuppliersService } from './suppliers.service';

/** Largest listings CSV accepted. */
const maxImportBytes = 10 * 1024 * 1024;
const uploadFile = csvUpload({ maxFileBytes: maxImportBytes, fields: 2 });

const shopIdOf = (req: Request) => shopOf(req).shop.id;
const param = (req: Request, name: string) => req.params[name] as string;

export interface PurchasingDeps {
  suppliers: SuppliersService;
  listingsImport: ListingsImportService;
  orders: OrdersService;
  reorder: ReorderService;
  returns: ReturnsService;
}

/**
 * /api/shops/:shopId/purchasing: suppliers and listings (read by everyone in the shop, kept by
 * owner and buyer), the reorder list, purchase orders (approval above a buyer's spending limit,
 * an owner's decision), receipts into stock, returns to suppliers and cores.
 */
export function purchasingRouter(deps: PurchasingDeps): Router {
  const { suppliers, listingsImport, orders, reorder, returns } = deps;
  const router = Router({ mergeParams: true });

  router.get('/suppliers', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Supplier');
    res.json({ suppliers: await suppliers.list(shopIdOf(req)) });
  });
  router.post('/suppliers', validate({ params: shopIdParamsSchema, body: supplierInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Supplier');
    res.status(201).json(await suppliers.create(shopIdOf(req), bodyOf(supplierInputSchema, req), auditActorOf(req)));
  });
  router.get('/suppliers/:supplierId', validate({ params: supplierIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Supplier');
    res.json(await suppliers.get(shopIdOf(req), param(req, 'supplierId')));
  });
  router.patch('/suppliers/:supplierId', validate({ params: supplierIdParamsSchema, body: supplierUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Supplier');
    res.json(await suppliers.update(shopIdOf(req), param(req, 'supplierId'), bodyOf(supplierUpdateSchema, req), auditActorOf(req)));
  });
  router.get('/suppliers/:supplierId/listings', validate({ params: supplierIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Supplier');
    await suppliers.get(shopIdOf(req), param(req, 'supplierId'));
    res.json({ listings: await suppliers.listings(shopIdOf(req), { supplierId: param(req, 'supplierId') }) });
  });
  router.post('/suppliers/:supplierId/listings', validate({ params: supplierIdParamsSchema, body: listingInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Supplier');
    res.status(201).json(await suppliers.createListing(shopIdOf(req), param(req, 'supplierId'), bodyOf(listingInputSchema, req), auditActorOf(req)));
  });

  // Permission is checked before the upload is read.
  router.post(
    '/listings/import',
    validate({ params: shopIdParamsSchema }),
    (req, _res, next) => {
      authorize(req, 'import', 'Supplier');
      next();
    },
    uploadFile,
    async (req, res) => {
      const fields = listingImportFieldsSchema.parse({ mode: req.body?.mode });
      if (!req.file) throw badRequest('Attach the CSV file in the form field "file".');
      res.json(await listingsImport.run(shopIdOf(req), { mode: fields.mode, file: req.file.buffer, fileName: req.file.originalname.slice(0, 200) }, auditActorOf(req)));
    },
  );
  router.patch('/listings/:listingId', validate({ params: listingIdParamsSchema, body: listingUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Supplier');
    res.json(await suppliers.updateListing(shopIdOf(req), param(req, 'listingId'), bodyOf(listingUpdateSchema, req), auditActorOf(req)));
  });
  router.delete('/listings/:listingId', validate({ params: listingIdParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Supplier');
    await suppliers.deleteListing(shopIdOf(req), param(req, 'listingId'), auditActorOf(req));
    res.status(204).end();
  });

  router.get('/parts/:partId', validate({ params: purchasingPartParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Supplier');
    res.json(await suppliers.partPurchasing(shopIdOf(req), param(req, 'partId')));
  });
  router.put('/parts/:partId', validate({ params: purchasingPartParamsSchema, body: partPurchasingSchema }), async (req, res) => {
    authorize(req, 'update', 'Supplier');
    res.json(await suppliers.setPartPurchasing(shopIdOf(req), param(req, 'partId'), bodyOf(partPurchasingSchema, req), auditActorOf(req)));
  });

  router.get('/settings', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Supplier');
    res.json(await suppliers.settings(shopIdOf(req)));
  });
  router.patch('/settings', validate({ params: shopIdParamsSchema, body: purchasingSettingsUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Settings');
    res.json(await suppliers.updateSettings(shopIdOf(req), bodyOf(purchasingSettingsUpdateSchema, req), auditActorOf(req)));
  });

  router.get('/reorder-list', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'PurchaseOrder');
    res.json(await reorder.list(shopIdOf(req)));
  });

  router.get('/orders', validate({ params: shopIdParamsSchema, query: purchaseOrderListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'PurchaseOrder');
    res.json(await orders.list(shopIdOf(req), req.query as { status?: PurchaseOrderStatus; supplierId?: string }));
  });
  router.post('/orders', validate({ params: shopIdParamsSchema, body: orderInputSchema }), async (req, res) => {
    authorize(req, 'create', 'PurchaseOrder');
    res.status(201).json(await orders.create(shopIdOf(req), bodyOf(orderInputSchema, req), auditActorOf(req)));
  });
  router.post('/orders/from-reorder', validate({ params: shopIdParamsSchema, body: orderFromReorderSchema }), async (req, res) => {
    authorize(req, 'create', 'PurchaseOrder');
    res.status(201).json(await reorder.draftOrders(shopIdOf(req), bodyOf(orderFromReorderSchema, req), auditActorOf(req)));
  });
  router.get('/orders/:orderId', validate({ params: orderIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'PurchaseOrder');
    res.json(await orders.get(shopIdOf(req), param(req, 'orderId')));
  });
  router.get('/orders/:orderId/pdf', validate({ params: orderIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'PurchaseOrder');
    const pdf = await orders.pdf(shopIdOf(req), param(req, 'orderId'));
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('Content-Disposition', `inline; filename="${pdf.fileName}"`);
    res.send(pdf.content);
  });
  router.patch('/orders/:orderId', validate({ params: orderIdParamsSchema, body: orderUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'PurchaseOrder');
    res.json(await orders.update(shopIdOf(req), param(req, 'orderId'), bodyOf(orderUpdateSchema, req), auditActorOf(req)));
  });
  router.post('/orders/:orderId/request-approval', validate({ params: orderIdParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'PurchaseOrder');
    res.json(await orders.requestApproval(shopIdOf(req), param(req, 'orderId'), auditActorOf(req)));
  });
  router.post('/orders/:orderId/approve', validate({ params: orderIdParamsSchema }), async (req, res) => {
    authorize(req, 'approve', 'PurchaseOrder');
    res.json(await orders.approve(shopIdOf(req), param(req, 'orderId'), auditActorOf(req)));
  });
  router.post('/orders/:orderId/reject', validate({ params: orderIdParamsSchema, body: reasonBodySchema }), async (req, res) => {
    authorize(req, 'approve', 'PurchaseOrder');
    res.json(await orders.reject(shopIdOf(req), param(req, 'orderId'), bodyOf(reasonBodySchema, req).reason, auditActorOf(req)));
  });
  router.post('/orders/:orderId/send', validate({ params: orderIdParamsSchema }), async (req, res) => {
    // Anyone who keeps orders may send an approved one; a draft also needs the CASL `send` rule,
    // whose condition is the buyer's spending limit (checked against this order's total).
    const { ability, membership, shop } = shopOf(req);
    const canSendSomething = ability.can('send', subjectOf('PurchaseOrder', { shopId: shop.id, totalMinor: 0 })) || ability.can('update', subjectOf('PurchaseOrder', { shopId: shop.id }));
    if (!canSendSomething) authorize(req, 'send', 'PurchaseOrder');
    const permissions = {
      canSendTotal: (totalShopMinor: number) => ability.can('send', subjectOf('PurchaseOrder', { shopId: shop.id, totalMinor: totalShopMinor })),
      spendingLimitMinor: membership.spendingLimitMinor,
    };
    res.json(await orders.send(shop.id, param(req, 'orderId'), permissions, auditActorOf(req)));
  });
  router.post('/orders/:orderId/cancel', validate({ params: orderIdParamsSchema, body: reasonBodySchema }), async (req, res) => {
    authorize(req, 'update', 'PurchaseOrder');
    res.json(await orders.cancel(shopIdOf(req), param(req, 'orderId'), bodyOf(reasonBodySchema, req).reason, auditActorOf(req)));
  });
  router.post('/orders/:orderId/close', validate({ params: orderIdParamsSchema, body: reasonBodySchema }), async (req, res) => {
    authorize(req, 'update', 'PurchaseOrder');
    res.json(await orders.closeBackOrder(shopIdOf(req), param(req, 'orderId'), bodyOf(reasonBodySchema, req).reason, auditActorOf(req)));
  });
  router.post('/orders/:orderId/receipts', validate({ params: orderIdParamsSchema, body: receiptInputSchema }), async (req, res) => {
    authorize(req, 'receive', 'Stock');
    res.json(await orders.receive(shopIdOf(req), param(req, 'orderId'), bodyOf(receiptInputSchema, req), auditActorOf(req)));
  });

  router.get('/returns', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'PurchaseOrder');
    res.json({ returns: await returns.list(shopIdOf(req)) });
  });
  router.post('/returns', validate({ params: shopIdParamsSchema, body: supplierReturnInputSchema }), async (req, res) => {
    authorize(req, 'update', 'PurchaseOrder');
    res.status(201).json(await returns.create(shopIdOf(req), bodyOf(supplierReturnInputSchema, req), auditActorOf(req)));
  });
  router.post('/returns/:returnId/credit', validate({ params: returnIdParamsSchema, body: creditInputSchema }), async (req, res) => {
    authorize(req, 'update', 'PurchaseOrder');
    res.json(await returns.credit(shopIdOf(req), param(req, 'returnId'), bodyOf(creditInputSchema, req), auditActorOf(req)));
  });

  return router;
}
