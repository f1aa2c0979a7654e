import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Router } from 'express';
import { REPO_ROOT } from '../config';

/**
 * Serves the exported web app. Client routes (e.g. /s/<code>, /account) get index.html and the
 * app's router takes over; hashed bundles are cached for a year, index.html never.
 */
/** Where the app's web scanner loads its QR decoder from: our own origin, never a CDN. */
export const ZXING_WASM_PATH = '/vendor/zxing_reader.wasm';
const ZXING_WASM_FILE = path.join(REPO_ROOT, 'node_modules', 'zxing-wasm', 'dist', 'reader', 'zxing_reader.wasm');

export function webAppRouter(distDir: string): Router {
  const router = express.Router();
  router.get(ZXING_WASM_PATH, (_req, res) => {
    res.setHeader('Cache-Control', 'public, max-age=86400');
    res.type('application/wasm').sendFile(ZXING_WASM_FILE);
  });
  const indexFile = path.join(distDir, 'index.html');
  router.use(
    express.static(distDir, {
      index: false,
      setHeaders: (res, filePath) => {
        if (filePath.includes(`${path.sep}_expo${path.sep}static${path.sep}`)) {
          res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        }
      },
    }),
  );
  router.get(/.*/, (_req, res) => {
    if (!existsSync(indexFile)) {
      res.status(503).type('text/plain').send('The Flakeline web app has not been built yet. Run `npm start`, which builds it.');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
  return router;
}
