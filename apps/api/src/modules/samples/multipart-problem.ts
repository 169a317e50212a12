import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { ApiError } from '../../core/api-error';

/** Runs a multer middleware and turns its errors into problems that say which limit was hit. */
export function multipart(handler: RequestHandler, limits: { fileSizeBytes: number; files: number }): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    handler(req, res, (err?: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        const field = err.field ? ` (field "${err.field}")` : '';
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(new ApiError(413, 'File too large', `A file${field} is larger than ${limits.fileSizeBytes / 1048576} MB.`, { type: 'file-too-large' }));
        }
        if (err.code === 'LIMIT_FILE_COUNT') {
          return next(ApiError.badRequest(`At most ${limits.files} files may be sent at once.`));
        }
        return next(ApiError.badRequest(`The upload could not be read: ${err.message}${field}.`));
      }
      next(err);
    });
  };
}
