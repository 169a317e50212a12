import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import {
  VerificationResultSchema,
  VerifyReportQuerySchema,
  VerifyUploadFieldsSchema,
  type VerifyReportQuery,
} from '@ohmprint/contracts';
import { ApiError, validate } from '../../core';
import { concurrencyLimit } from '../../core/concurrency-limit';
import { PostgresRateStore } from '../../core/postgres-rate-store';
import { dataSource } from '../../db/data-source';
import { registerRoute } from '../../openapi/registry';
import { singleFileUpload } from '../reports/single-file-upload';
import { pdfDigestStorage, type PdfDigest } from './pdf-digest-storage';
import { verifyByCode, verifyUpload } from './verify-report';

const tag = 'Public verification';
export const MAX_UPLOAD_BYTES = 20 * 1024 * 1024;
/** Anonymous PDF checks handled at once per API process (each is hashed as it streams in). */
export const MAX_CONCURRENT_UPLOADS = 4;

export interface VerificationRouterOptions {
  /** Checks per client address per window; codes carry ~59 bits, the limit keeps scraping slow. */
  limit?: number;
  windowMs?: number;
}

/** The public checks, without sign-in: by number and code, or by uploading the PDF. */
export function verificationRouter({ limit = 30, windowMs = 60_000 }: VerificationRouterOptions = {}): Router {
  const router = Router();
  router.use(
    rateLimit({
      windowMs,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      store: new PostgresRateStore(dataSource, 'verify:'),
      handler: (_req, _res, next) => {
        next(new ApiError(429, 'Too many checks', `At most ${limit} checks per ${Math.round(windowMs / 1000)} seconds from one address; wait a moment and try again.`, { type: 'rate-limited' }));
      },
    }),
  );

  registerRoute({ method: 'get', path: '/public/verify', tag, summary: 'Check a report by number and verification code: valid, superseded (names the replacement) or revoked', roles: [], query: VerifyReportQuerySchema, response: VerificationResultSchema });
  router.get('/', validate({ query: VerifyReportQuerySchema }), async (_req, res) => {
    const { report, code } = res.locals.query as VerifyReportQuery;
    res.set('Cache-Control', 'no-store').json(await verifyByCode(dataSource.manager, report, code));
  });

  registerRoute({ method: 'post', path: '/public/verify/upload', tag, summary: 'Check an uploaded PDF (field "file", ≤ 20 MB) against the issued reports by SHA-256', roles: [], body: VerifyUploadFieldsSchema, requestMediaType: 'multipart/form-data', response: VerificationResultSchema });
  router.post('/upload', concurrencyLimit(MAX_CONCURRENT_UPLOADS, 'uploaded PDF checks'), singleFileUpload('file', MAX_UPLOAD_BYTES, 'PDF', pdfDigestStorage()), validate({ body: VerifyUploadFieldsSchema }), async (req, res) => {
    // Hashed as it arrived; the file itself was never held (see pdfDigestStorage).
    const digest = (req.file as Express.Multer.File & { digest: PdfDigest }).digest;
    if (!digest.startsLikePdf) {
      throw ApiError.badRequest('The uploaded file is not a PDF (it does not start with "%PDF-").', [{ field: 'file', message: 'must be a PDF' }]);
    }
    res.set('Cache-Control', 'no-store').json(await verifyUpload(dataSource.manager, digest, res.locals.body as { report?: string; code?: string }));
  });

  return router;
}
