import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Router } from 'express';

/**
 * Serves the exported web app. Client routes (e.g. /s/<code>, /account) get index.html and the
 * app's router takes over; hashed bundles are cached for a year, index.html never.
 */
export function webAppRouter(distDir: string): Router {
  const router = express.Router();
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
