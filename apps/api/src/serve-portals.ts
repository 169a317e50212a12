import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import express, { type Express } from 'express';

interface Portal {
  mount: string;
  folder: string;
}

/**
 * Serves each built portal with an SPA fallback to its index.html, but only when its build exists
 * (a developer running the API alone gets plain 404s instead of crashes).
 */
export function servePortals(app: Express, distDir: string): string[] {
  const portals: Portal[] = [
    { mount: '/lab', folder: join(distDir, 'lab-portal', 'browser') },
    { mount: '/', folder: join(distDir, 'client-portal', 'browser') },
  ];
  const served: string[] = [];
  for (const portal of portals) {
    const folder = resolve(portal.folder);
    const index = join(folder, 'index.html');
    if (!existsSync(index)) continue;
    const router = express.Router();
    router.use(express.static(folder, { index: false, maxAge: '1h', fallthrough: true }));
    router.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(index);
    });
    app.use(portal.mount, router);
    served.push(portal.mount);
  }
  return served;
}
