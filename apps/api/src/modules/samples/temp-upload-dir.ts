import { randomUUID } from 'node:crypto';
import { mkdtemp, readdir, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { config } from '../../config';

/** Prefix of every upload's private temporary folder (in `UPLOAD_TMP_DIR`, by default the OS temp folder). */
export const UPLOAD_DIR_PREFIX = 'ohmprint-upload-';

/**
 * Multer with its files written to a private temporary folder instead of memory, so an upload of
 * many megabytes costs the API a few buffers of the stream, not the whole body. Each request gets
 * its own folder (`mkdtemp`, readable by this user only) and random file names; the folder and
 * everything in it is removed when the response ends, whatever happened — answered, refused by a
 * limit, failed, or the client gone mid-stream. `select` picks the fields, e.g.
 * `(m) => m.array('files')`; the files arrive with `path` and `size` (no `buffer`).
 */
export function uploadToTempFiles(options: Omit<multer.Options, 'storage' | 'dest'>, select: (m: multer.Multer) => RequestHandler): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    void mkdtemp(join(config.uploadTmpDir, UPLOAD_DIR_PREFIX)).then(
      (dir) => {
        // Removed twice on purpose: when the response closes (answered or cut off), and when the
        // parser stops, in case a file was still being opened when the first removal ran.
        const removeDir = () => void rm(dir, { recursive: true, force: true, maxRetries: 3 }).catch(() => undefined);
        res.once('close', removeDir);
        const storage = multer.diskStorage({ destination: dir, filename: (_r, _f, cb) => cb(null, randomUUID()) });
        select(multer({ ...options, storage }))(req, res, (err?: unknown) => {
          // Already answered or the client gone (the request itself is always finished by now).
          if (res.writableEnded || res.destroyed) removeDir();
          next(err);
        });
      },
      (err: unknown) => next(err),
    );
  };
}

/**
 * Removes upload folders a stopped process left behind (killed mid-upload, machine lost power).
 * Only folders untouched for `olderThanMs` go: another API process on the same machine may be
 * receiving an upload into a folder of its own right now. Returns the folders removed.
 */
export async function sweepStaleUploadDirs(olderThanMs = 60 * 60 * 1000, root = config.uploadTmpDir): Promise<string[]> {
  const names = (await readdir(root).catch(() => [] as string[])).filter((n) => n.startsWith(UPLOAD_DIR_PREFIX));
  const removed: string[] = [];
  for (const name of names) {
    const dir = join(root, name);
    const info = await stat(dir).catch(() => null);
    if (!info?.isDirectory() || Date.now() - info.mtimeMs < olderThanMs) continue;
    await rm(dir, { recursive: true, force: true }).then(() => removed.push(dir), () => undefined);
  }
  return removed;
}
