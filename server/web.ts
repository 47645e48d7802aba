// Serves the exported web build (dist/) with an SPA fallback: any non-/api GET that is not a file
// gets index.html, so deep links work. Hashed bundles are cached long, index.html never.
import fs from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';

export function webRouter(distDir: string): Router {
  const router = Router();
  const indexFile = path.join(distDir, 'index.html');
  router.use(
    express.static(distDir, {
      redirect: false,
      index: false,
      setHeaders(res, file) {
        if (file.includes(`${path.sep}_expo${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
      },
    }),
  );
  router.get('/{*splat}', (req, res) => {
    if (!fs.existsSync(indexFile)) {
      res
        .status(503)
        .type('text/plain')
        .send('The web build has not been exported yet. Run `npm start`, which exports it to dist/.');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexFile);
  });
  return router;
}
