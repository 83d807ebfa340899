import { Router, type Request, type Response } from 'express';
import {
  fileUploadFieldsSchema,
  numbersCheckInputSchema,
  odometerInputSchema,
  shopIdParamsSchema,
  statusMoveInputSchema,
  vehicleFileContentQuerySchema,
  vehicleFileParamsSchema,
  vehicleIdParamsSchema,
  vehicleInputSchema,
  vehicleListQuerySchema,
  vehicleUpdateSchema,
} from '@tappet/contracts';
import { subjectOf } from '@tappet/permissions';
import { forbidden } from '../../lib/http-error';
import { auditActorOf } from '../../middleware/authenticate';
import { authorize, shopOf } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import { memoryUpload, vehicleUploadLimits, type UploadLimits } from '../uploads/upload-middleware';
import { prepareUpload, type PreparedUpload } from '../uploads/upload-pipeline';
import type { FieldPermission, VehicleListQuery, VehiclesService } from './vehicles.service';

const params = (req: Request) => ({ shopId: shopOf(req).shop.id, vehicleId: req.params['vehicleId'] as string });

/**
 * What a vehicle cost the shop is hidden from roles whose ability may not read it (mechanics,
 * issue 10): the field is answered as null, as for a vehicle with none recorded.
 */
function masked<T extends { acquisitionCostMinor: number | null }>(req: Request, vehicle: T): T {
  const { shop, ability } = shopOf(req);
  return ability.can('read', subjectOf('Vehicle', { shopId: shop.id }), 'acquisitionCostMinor') ? vehicle : { ...vehicle, acquisitionCostMinor: null };
}

/** The field-level rule of the caller's ability: may they change this money field of a vehicle? */
const fieldPermission =
  (req: Request): FieldPermission =>
  (field) => {
    const { shop, ability } = shopOf(req);
    return ability.can('update', subjectOf('Vehicle', { shopId: shop.id }), field);
  };

/**
 * `Content-Disposition` for a stored file: the name people uploaded, ASCII-only in `filename` and
 * in full as RFC 8187 `filename*`.
 */
export function contentDisposition(type: 'inline' | 'attachment', name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `${type}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`)}`;
}

/**
 * /api/shops/:shopId/vehicles (mounted behind requireAuth and tenantContext). Everyone in the shop
 * reads; owners and mechanics create and change vehicles, but only roles allowed the money fields
 * (not mechanics) may set the acquisition cost or asking price.
 */
export function vehiclesRouter(deps: { vehicles: VehiclesService; uploadLimits?: UploadLimits }): Router {
  const { vehicles } = deps;
  const router = Router({ mergeParams: true });
  const upload = memoryUpload('files', deps.uploadLimits ?? vehicleUploadLimits);

  router.get('/', validate({ params: shopIdParamsSchema, query: vehicleListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Vehicle');
    const list = await vehicles.list(shopOf(req).shop.id, req.query as unknown as VehicleListQuery);
    res.json({ ...list, items: list.items.map((v) => masked(req, v)) });
  });

  router.post('/', validate({ params: shopIdParamsSchema, body: vehicleInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Vehicle');
    res.status(201).json(masked(req, await vehicles.create(shopOf(req).shop.id, bodyOf(vehicleInputSchema, req), auditActorOf(req), fieldPermission(req))));
  });

  router.get('/:vehicleId', validate({ params: vehicleIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    res.json(masked(req, await vehicles.detail(shopId, vehicleId)));
  });

  // What the vehicle has cost and its margin: not for roles that may not read the margin (mechanics).
  router.get('/:vehicleId/costs', validate({ params: vehicleIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    const { shop, ability } = shopOf(req);
    if (!ability.can('read', subjectOf('Vehicle', { shopId: shop.id }), 'margin')) {
      await vehicles.detail(shopId, vehicleId); // another shop's id stays a 404, not a 403
      throw forbidden('Only the owner sees what a vehicle cost the shop and its margin.');
    }
    res.json(await vehicles.costs(shopId, vehicleId));
  });

  router.patch('/:vehicleId', validate({ params: vehicleIdParamsSchema, body: vehicleUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    res.json(masked(req, await vehicles.update(shopId, vehicleId, bodyOf(vehicleUpdateSchema, req), auditActorOf(req), fieldPermission(req))));
  });

  router.post('/:vehicleId/status', validate({ params: vehicleIdParamsSchema, body: statusMoveInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    res.json(masked(req, await vehicles.moveStatus(shopId, vehicleId, bodyOf(statusMoveInputSchema, req), auditActorOf(req))));
  });

  router.post('/:vehicleId/odometer-readings', validate({ params: vehicleIdParamsSchema, body: odometerInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    res.status(201).json(await vehicles.addOdometerReading(shopId, vehicleId, bodyOf(odometerInputSchema, req), auditActorOf(req)));
  });

  router.post('/:vehicleId/numbers-check', validate({ params: vehicleIdParamsSchema, body: numbersCheckInputSchema }), async (req, res) => {
    authorize(req, 'update', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    res.json(masked(req, await vehicles.recordNumbersCheck(shopId, vehicleId, bodyOf(numbersCheckInputSchema, req), auditActorOf(req))));
  });

  router.get('/:vehicleId/timeline', validate({ params: vehicleIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    res.json(await vehicles.timeline(shopId, vehicleId));
  });

  router.get('/:vehicleId/fitment', validate({ params: vehicleIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Vehicle');
    authorize(req, 'read', 'Part');
    const { shopId, vehicleId } = params(req);
    res.json(await vehicles.fitment(shopId, vehicleId));
  });

  // Permission and the vehicle are checked before the body is read, so a refused or misdirected
  // caller never uploads megabytes. Every file is checked before any is stored.
  router.post(
    '/:vehicleId/files',
    validate({ params: vehicleIdParamsSchema }),
    async (req, _res, next) => {
      authorize(req, 'update', 'Vehicle');
      const { shopId, vehicleId } = params(req);
      await vehicles.assertVehicle(shopId, vehicleId);
      next();
    },
    upload,
    async (req, res) => {
      const { shopId, vehicleId } = params(req);
      const fields = fileUploadFieldsSchema.parse(req.body ?? {});
      const received = (req.files ?? []) as Express.Multer.File[];
      if (received.length === 0) {
        res.status(400).json({ error: { code: 'bad_request', message: 'Choose at least one photo or PDF to upload (form field "files").' } });
        return;
      }
      const prepared: PreparedUpload[] = [];
      for (const file of received) prepared.push(await prepareUpload(file));
      res.status(201).json({ files: await vehicles.addFiles(shopId, vehicleId, prepared, fields.caption, auditActorOf(req)) });
    },
  );

  const sendFile = (variant: 'original' | 'thumbnail') => async (req: Request, res: Response) => {
    authorize(req, 'read', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    const { row, data } = await vehicles.readFile(shopId, vehicleId, req.params['fileId'] as string, variant);
    const download = variant === 'original' && (row.kind === 'document' || (req.query as { download?: string }).download === '1');
    const extension = row.kind === 'photo' ? 'jpg' : 'pdf';
    const name = variant === 'thumbnail' ? `thumbnail-${row.originalName.replace(/\.[^.]*$/, '')}.jpg` : row.originalName.replace(/\.[^.]*$/, '') + `.${extension}`;
    res.setHeader('Content-Type', variant === 'thumbnail' ? 'image/jpeg' : row.mediaType);
    res.setHeader('Content-Length', String(data.length));
    res.setHeader('Content-Disposition', contentDisposition(download ? 'attachment' : 'inline', name));
    res.setHeader('X-Content-Type-Options', 'nosniff');
    // Opened on its own, the file runs nothing and loads nothing.
    res.setHeader('Content-Security-Policy', "default-src 'none'; img-src 'self'; style-src 'unsafe-inline'; sandbox");
    res.setHeader('Cache-Control', 'private, max-age=300');
    res.end(data);
  };

  router.get('/:vehicleId/files/:fileId/content', validate({ params: vehicleFileParamsSchema, query: vehicleFileContentQuerySchema }), sendFile('original'));
  router.get('/:vehicleId/files/:fileId/thumbnail', validate({ params: vehicleFileParamsSchema, query: vehicleFileContentQuerySchema }), sendFile('thumbnail'));

  router.delete('/:vehicleId/files/:fileId', validate({ params: vehicleFileParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Vehicle');
    const { shopId, vehicleId } = params(req);
    await vehicles.removeFile(shopId, vehicleId, req.params['fileId'] as string, auditActorOf(req));
    res.status(204).end();
  });

  return router;
}
