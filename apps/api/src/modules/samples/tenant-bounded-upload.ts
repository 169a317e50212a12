import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type multer from 'multer';
import { keyedConcurrencyLimit } from '../../core/concurrency-limit';
import { multerLimits, multipart } from './multipart-problem';
import { uploadToTempFiles } from './temp-upload-dir';

export interface TenantBoundedUpload {
  limits: { fileSizeBytes: number; files: number };
  /** The multipart fields taken, e.g. `(m) => m.single('photo')`. */
  select: (m: multer.Multer) => RequestHandler;
  /** At most this many uploads of one tenant in flight in this process. */
  perTenant: number;
  /** What the 429 says is limited, e.g. 'photo uploads of one lab'. */
  what: string;
  /** The tenant an upload counts against (the lab, the client organisation), from the signed-in request. */
  tenantOf: (res: Response) => string;
}

/**
 * The middleware of a route that takes files: at most `perTenant` uploads of one tenant at once
 * (the next of that tenant is refused with a 429 naming the limit before its body is read, while
 * other tenants go on), each streamed to a private temporary folder removed when the response ends
 * (`uploadToTempFiles`), multer's refusals answered as problems naming the limit. A request that is
 * not multipart (a JSON body where the file is optional) carries no file and is not counted.
 */
export function tenantBoundedUpload(options: TenantBoundedUpload): RequestHandler[] {
  const perTenant = keyedConcurrencyLimit(options.perTenant, options.what, options.tenantOf);
  const upload = multipart(uploadToTempFiles({ limits: multerLimits(options.limits) }, options.select), options.limits);
  const onlyMultipart = (handler: RequestHandler): RequestHandler => (req: Request, res: Response, next: NextFunction) =>
    req.is('multipart/form-data') ? handler(req, res, next) : next();
  return [onlyMultipart(perTenant), onlyMultipart(upload)];
}
