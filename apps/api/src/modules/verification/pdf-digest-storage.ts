import { createHash } from 'node:crypto';
import type { Request } from 'express';
import type multer from 'multer';

/** What a PDF check needs of an uploaded file, taken while it streams in: the file itself is never kept. */
export interface PdfDigest {
  size: number;
  sha256: string;
  /** The file starts with "%PDF-". */
  startsLikePdf: boolean;
  /** The report number an Ohmprint-signed PDF names in its signature's reason ("/Reason (Test report …)"). */
  claimedNumber: string | null;
}

const REASON = /\/Reason\s*\(Test report ([A-Z0-9-]{8,40})\)/;
/** Text carried from one chunk to the next so a reason split across two chunks is still read. */
const OVERLAP = 512;

/** Reads a whole buffer as the stream does (one chunk): the same answer as a streamed file. */
export function claimedNumberIn(text: string): string | null {
  return REASON.exec(text)?.[1] ?? null;
}

/**
 * A multer storage engine that hashes the file (SHA-256) and looks for the signature's reason as
 * the bytes arrive, then lets them go: a 20 MB PDF costs a 64 KB chunk of memory, not 20 MB, and
 * nothing is written to disk. The digest is on `req.file` as `digest`.
 */
export function pdfDigestStorage(): multer.StorageEngine {
  return {
    _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<Express.Multer.File> & { digest?: PdfDigest }) => void) {
      const hash = createHash('sha256');
      let size = 0;
      let head = '';
      let carried = '';
      let claimed: string | null = null;
      file.stream.on('data', (chunk: Buffer) => {
        hash.update(chunk);
        size += chunk.length;
        if (head.length < 5) head += chunk.subarray(0, 5 - head.length).toString('latin1');
        if (claimed === null) {
          const text = carried + chunk.toString('latin1');
          claimed = claimedNumberIn(text);
          carried = text.slice(-OVERLAP);
        }
      });
      file.stream.once('error', (err) => cb(err));
      file.stream.once('end', () => cb(null, { size, digest: { size, sha256: hash.digest('hex'), startsLikePdf: head === '%PDF-', claimedNumber: claimed } }));
    },
    _removeFile(_req: Request, _file: Express.Multer.File, cb: (error: Error | null) => void) {
      cb(null);
    },
  };
}
