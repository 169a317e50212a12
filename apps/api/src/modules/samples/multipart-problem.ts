import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { ApiError } from '../../core/api-error';
import { refuseUnsafeText, unsafeTextFields } from '../../core/safe-text';

/** The longest file name kept with an upload (common file systems' limit). */
export const MAX_FILE_NAME_LENGTH = 255;

/**
 * Limits on the text parts of every multipart upload: an upload carries a handful of short form
 * fields beside its files, so thousands of fields or megabyte-long values are refused at once
 * instead of being held in memory.
 */
export const MULTIPART_TEXT_LIMITS = { fields: 30, fieldSizeBytes: 16 * 1024, fieldNameBytes: 100 } as const;

/** multer's `limits` for `files` files of at most `fileSizeBytes` each, with the text limits. */
export function multerLimits(limits: { fileSizeBytes: number; files: number }): multer.Options['limits'] {
  return {
    fileSize: limits.fileSizeBytes,
    files: limits.files,
    fields: MULTIPART_TEXT_LIMITS.fields,
    fieldSize: MULTIPART_TEXT_LIMITS.fieldSizeBytes,
    fieldNameSize: MULTIPART_TEXT_LIMITS.fieldNameBytes,
    parts: limits.files + MULTIPART_TEXT_LIMITS.fields,
  };
}

/** The problem for a multer limit, naming the limit that was hit (and the field, when known). */
export function multerProblem(err: multer.MulterError, limits: { fileSizeBytes: number; files: number }, what = 'A file'): ApiError {
  const field = err.field ? ` (field "${err.field}")` : '';
  const errors = err.field ? [{ field: err.field, message: err.message }] : undefined;
  switch (err.code) {
    case 'LIMIT_FILE_SIZE':
      return new ApiError(413, 'File too large', `${what}${field} is larger than ${limits.fileSizeBytes / 1048576} MB.`, { type: 'file-too-large', errors });
    case 'LIMIT_FILE_COUNT':
      return new ApiError(413, 'Too many files', `At most ${limits.files} files may be sent at once.`, { type: 'too-many-files' });
    case 'LIMIT_FIELD_COUNT':
      return new ApiError(413, 'Too many form fields', `At most ${MULTIPART_TEXT_LIMITS.fields} text fields may be sent with an upload.`, { type: 'too-many-fields' });
    case 'LIMIT_PART_COUNT':
      return new ApiError(413, 'Too many parts', `At most ${limits.files + MULTIPART_TEXT_LIMITS.fields} parts (files and fields) may be sent at once.`, { type: 'too-many-parts' });
    case 'LIMIT_FIELD_VALUE':
      return new ApiError(413, 'Form field too long', `A text field${field} is longer than ${MULTIPART_TEXT_LIMITS.fieldSizeBytes / 1024} KB.`, { type: 'field-too-long', errors });
    case 'LIMIT_FIELD_KEY':
      return new ApiError(413, 'Field name too long', `A field name is longer than ${MULTIPART_TEXT_LIMITS.fieldNameBytes} bytes.`, { type: 'field-name-too-long' });
    default:
      return ApiError.badRequest(`The upload could not be read: ${err.message}${field}.`, errors);
  }
}

/** What the multipart parser (busboy) says about a body it cannot read. */
const MALFORMED_MULTIPART = /^(Malformed part header|Unexpected end of form|Multipart: Boundary not found|Malformed urlencoded form)/i;

/** Runs a multer middleware and turns its errors into problems that say which limit was hit. */
export function multipart(handler: RequestHandler, limits: { fileSizeBytes: number; files: number }): RequestHandler {
  return (req: Request, res: Response, next: NextFunction) => {
    handler(req, res, (err?: unknown) => {
      if (err instanceof multer.MulterError) return next(multerProblem(err, limits));
      if (err instanceof Error && MALFORMED_MULTIPART.test(err.message)) {
        // The multipart parser's own refusals (a part header past its size limit, a cut-off body).
        return next(ApiError.badRequest(`The upload could not be read: ${err.message.toLowerCase()} (a file name or part header may be too long, or the body was cut off).`, [{ field: '(body)', message: err.message.toLowerCase() }]));
      }
      if (err) return next(err);
      next(fileNameProblem(req));
    });
  };
}

/**
 * File names are stored and shown beside what was uploaded: a NUL character or a lone surrogate
 * (which PostgreSQL cannot store) or a name past `MAX_FILE_NAME_LENGTH` is a 400 naming the
 * field and the file's place in it, e.g. `files[2]`.
 */
function fileNameProblem(req: Request): ApiError | undefined {
  const files: Express.Multer.File[] = req.file ? [req.file] : Array.isArray(req.files) ? req.files : Object.values(req.files ?? {}).flat();
  const seen = new Map<string, number>();
  const errors = files.flatMap((f) => {
    const index = seen.get(f.fieldname) ?? 0;
    seen.set(f.fieldname, index + 1);
    const field = `${f.fieldname}[${index}]`;
    const unsafe = unsafeTextFields(f.originalname, field).map((e) => ({ field, message: `file name ${e.message}` }));
    if (unsafe.length) return unsafe;
    return f.originalname.length > MAX_FILE_NAME_LENGTH ? [{ field, message: `file name is longer than ${MAX_FILE_NAME_LENGTH} characters` }] : [];
  });
  return errors.length ? refuseUnsafeText('upload', errors) : undefined;
}
