import fs from 'node:fs';
import path from 'node:path';
import compression from 'compression';
import express, { type Router } from 'express';

/**
 * Serves the built web app (when `webDir` holds one) with an SPA fallback for non-API GETs, and
 * the shipped fonts from `fontsDir` with a long cache. Text assets go out compressed (brotli or
 * gzip): the first load on a workshop tablet's mobile connection carries a third of the bytes.
 * API answers are not compressed here (they are small, and it keeps secrets shown once, such as a
 * new API key, away from compression side channels).
 */
export function staticRouter(options: { webDir: string; fontsDir: string }): Router {
  const router = express.Router();
  router.use(compression());
  if (fs.existsSync(options.fontsDir)) {
    router.use('/fonts', express.static(options.fontsDir, { maxAge: '365d', immutable: true, index: false, fallthrough: false }));
  }
  const indexHtml = path.join(options.webDir, 'index.html');
  if (fs.existsSync(indexHtml)) {
    // Vite puts content-hashed files under /assets: safe to cache for a year.
    router.use('/assets', express.static(path.join(options.webDir, 'assets'), { maxAge: '365d', immutable: true, index: false, fallthrough: false }));
    router.use(express.static(options.webDir, { index: false, maxAge: '1h' }));
    router.get(/^(?!\/api(?:\/|$)).*/, (req, res, next) => {
      if (!req.accepts('html')) return next();
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(indexHtml);
    });
  } else {
    router.get('/', (_req, res) => {
      res.status(404).type('text/plain').send('The web app is not built yet: run `npm run build:web` and reload. The API lives under /api (see /api/openapi.json).\n');
    });
  }
  return router;
}
