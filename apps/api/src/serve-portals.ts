import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import express, { type Express, type Response } from 'express';

/** Angular's production build names bundles and fonts by content hash (`main-ABCD1234.js`): they never change. */
const HASHED_ASSET = /-[A-Z0-9]{8}\.(js|css|woff2?|ttf|svg|png|jpg|webp)$/;

function cacheFor(res: Response, path: string): void {
  res.setHeader('Cache-Control', HASHED_ASSET.test(path) ? 'public, max-age=31536000, immutable' : 'no-cache');
}

interface Portal {
  mount: string;
  folder: string;
}

/**
 * Serves each built portal with an SPA fallback to its index.html, but only when its build exists
 * (a developer running the API alone gets plain 404s instead of crashes). Hashed bundles are cached
 * for good; everything else (index.html above all) is revalidated, so a new build reaches every user.
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
    router.use(express.static(folder, { index: false, fallthrough: true, setHeaders: cacheFor }));
    router.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(index);
    });
    app.use(portal.mount, router);
    served.push(portal.mount);
  }
  return served;
}
