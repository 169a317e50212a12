import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { ApiError } from '../../core/api-error';
import { multerLimits, multerProblem } from '../samples/multipart-problem';

/** A byte limit as people say it: 512 KB, 1 MB, 25 MB. */
export function sizeInWords(bytes: number): string {
  return bytes < 1024 * 1024 ? `${Math.round(bytes / 1024)} KB` : `${Math.round(bytes / 1024 / 1024)} MB`;
}

/**
 * Multipart upload of one file, held in memory (small files: a logo, a PKCS#12 file) unless a
 * `storage` engine takes it as it streams (the public PDF check only hashes it), with multer's
 * errors turned into problems that name the field and the limit.
 */
export function singleFileUpload(field: string, maxBytes: number, what: string, storage: multer.StorageEngine = multer.memoryStorage()) {
  const limits = { fileSizeBytes: maxBytes, files: 1 };
  const upload = multer({ storage, limits: multerLimits(limits) }).single(field);
  return (req: Request, res: Response, next: NextFunction): void => {
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          next(new ApiError(413, 'File too large', `The ${what} is larger than ${sizeInWords(maxBytes)}.`, { type: 'file-too-large', errors: [{ field, message: `must be at most ${maxBytes} bytes` }] }));
        } else {
          next(multerProblem(err, limits, `The ${what}`));
        }
        return;
      }
      if (err) {
        next(err);
        return;
      }
      if (!req.file) {
        next(ApiError.badRequest(`Attach the ${what} as the multipart field "${field}".`, [{ field, message: 'is required' }]));
        return;
      }
      next();
    });
  };
}
