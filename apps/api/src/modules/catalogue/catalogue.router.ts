import { Router, type RequestHandler } from 'express';
import {
  fitmentIdParamsSchema,
  fitmentInputSchema,
  fitmentUpdateSchema,
  importFieldsSchema,
  linkIdParamsSchema,
  linkInputSchema,
  linkUpdateSchema,
  partIdParamsSchema,
  partInputSchema,
  partListQuerySchema,
  partUpdateSchema,
  resolveQuerySchema,
  shopIdParamsSchema,
} from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import { badRequest } from '../../lib/http-error';
import { csvUpload } from '../uploads/upload-middleware';
import { auditActorOf, requireAuth } from '../../middleware/authenticate';
import { authorize, shopOf, tenantContext } from '../../middleware/tenant-context';
import { bodyOf, validate } from '../../middleware/validate';
import type { AuditActor } from '../audit/audit.service';
import type { CatalogueService, PartListQuery } from './catalogue.service';
import { csvColumns, type ImportKind, type ImportService } from './imports/import.service';

/** Largest CSV upload accepted. */
export const maxImportBytes = 20 * 1024 * 1024;

const uploadFile = csvUpload({ maxFileBytes: maxImportBytes, fields: 4 });

// A person or an API key: both may write the catalogue (a key with the buyer role).
const actorOf = (req: Parameters<RequestHandler>[0]): AuditActor => {
  const { userId, apiKeyId, ip } = auditActorOf(req);
  return { userId, apiKeyId, ip };
};

/**
 * /api/shops/:shopId catalogue routes: parts, links, fitments, lineage, problems, CSV import and
 * export. Everyone in the shop reads; writing needs the `Part` abilities (owner and buyer).
 */
export function catalogueRouter(deps: { db: Database; catalogue: CatalogueService; imports: ImportService }): Router {
  const { catalogue, imports } = deps;
  const router = Router({ mergeParams: true });
  // Only this router's own paths: other shop routes mounted at /shops/:shopId pass straight through.
  router.use(['/parts', '/part-links', '/fitments', '/lineage', '/catalogue', '/imports', '/exports'], requireAuth, tenantContext(deps.db));
  const shopId = (req: Parameters<RequestHandler>[0]) => shopOf(req).shop.id;

  router.get('/parts', validate({ params: shopIdParamsSchema, query: partListQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await catalogue.list(shopId(req), req.query as unknown as PartListQuery));
  });

  router.post('/parts', validate({ params: shopIdParamsSchema, body: partInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Part');
    res.status(201).json(await catalogue.create(shopId(req), bodyOf(partInputSchema, req), actorOf(req)));
  });

  router.get('/parts/:partId', validate({ params: partIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await catalogue.detail(shopId(req), req.params['partId'] as string));
  });

  router.patch('/parts/:partId', validate({ params: partIdParamsSchema, body: partUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Part');
    res.json(await catalogue.update(shopId(req), req.params['partId'] as string, bodyOf(partUpdateSchema, req), actorOf(req)));
  });

  router.get('/parts/:partId/lineage', validate({ params: partIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await catalogue.lineage(shopId(req), req.params['partId'] as string));
  });

  router.post('/part-links', validate({ params: shopIdParamsSchema, body: linkInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Part');
    res.status(201).json(await catalogue.createLink(shopId(req), bodyOf(linkInputSchema, req), actorOf(req)));
  });

  router.patch('/part-links/:linkId', validate({ params: linkIdParamsSchema, body: linkUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Part');
    res.json(await catalogue.updateLink(shopId(req), req.params['linkId'] as string, bodyOf(linkUpdateSchema, req), actorOf(req)));
  });

  router.delete('/part-links/:linkId', validate({ params: linkIdParamsSchema }), async (req, res) => {
    // Removing a link edits the catalogue; the Part rules give delete to owners only, update to buyers too.
    authorize(req, 'update', 'Part');
    await catalogue.deleteLink(shopId(req), req.params['linkId'] as string, actorOf(req));
    res.status(204).end();
  });

  router.post('/fitments', validate({ params: shopIdParamsSchema, body: fitmentInputSchema }), async (req, res) => {
    authorize(req, 'create', 'Part');
    res.status(201).json(await catalogue.createFitment(shopId(req), bodyOf(fitmentInputSchema, req), actorOf(req)));
  });

  router.patch('/fitments/:fitmentId', validate({ params: fitmentIdParamsSchema, body: fitmentUpdateSchema }), async (req, res) => {
    authorize(req, 'update', 'Part');
    res.json(await catalogue.updateFitment(shopId(req), req.params['fitmentId'] as string, bodyOf(fitmentUpdateSchema, req), actorOf(req)));
  });

  router.delete('/fitments/:fitmentId', validate({ params: fitmentIdParamsSchema }), async (req, res) => {
    authorize(req, 'update', 'Part');
    await catalogue.deleteFitment(shopId(req), req.params['fitmentId'] as string, actorOf(req));
    res.status(204).end();
  });

  router.get('/lineage/resolve', validate({ params: shopIdParamsSchema, query: resolveQuerySchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json(await catalogue.resolve(shopId(req), (req.query as unknown as { number: string }).number));
  });

  router.get('/catalogue/problems', validate({ params: shopIdParamsSchema }), async (req, res) => {
    authorize(req, 'read', 'Part');
    res.json({ problems: await catalogue.problems(shopId(req)) });
  });

  // Permission is checked before the upload is read, so a refused caller never uploads 20 MB.
  router.post(
    '/imports',
    validate({ params: shopIdParamsSchema }),
    (req, _res, next) => {
      authorize(req, 'import', 'Part');
      next();
    },
    uploadFile,
    async (req, res) => {
      const fields = importFieldsSchema.parse({ kind: req.body?.kind, mode: req.body?.mode });
      if (!req.file) throw badRequest('Attach the CSV file in the form field "file".');
      const result = await imports.run(shopId(req), { kind: fields.kind, mode: fields.mode, file: req.file.buffer, fileName: req.file.originalname.slice(0, 200) }, actorOf(req));
      res.json(result);
    },
  );

  for (const kind of Object.keys(csvColumns) as ImportKind[]) {
    router.get(`/exports/${kind}.csv`, validate({ params: shopIdParamsSchema }), async (req, res) => {
      authorize(req, 'read', 'Part');
      res.setHeader('Content-Type', 'text/csv; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="${kind}.csv"`);
      for await (const chunk of imports.exportCsv(shopId(req), kind)) {
        if (!res.write(chunk)) await new Promise((resolve) => res.once('drain', resolve));
      }
      res.end();
    });
  }

  return router;
}
