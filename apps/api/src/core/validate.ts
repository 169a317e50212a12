import type { NextFunction, Request, Response } from 'express';
import type { z } from 'zod';
import { fieldInWords, type FieldError } from '@ohmprint/contracts';
import { ApiError } from './api-error';
import { refuseUnsafeText, unsafeTextFields } from './safe-text';

export interface RequestSchemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

const WHERE: Record<keyof RequestSchemas, string> = { body: 'request body', query: 'query string', params: 'URL' };

export function fieldErrors(error: z.ZodError): FieldError[] {
  return error.issues.map((issue) => ({
    field: issue.path.length ? issue.path.map(String).join('.') : '(root)',
    message: issue.message,
  }));
}

/**
 * Parses body, query and params with the given schemas; parsed values land in
 * `res.locals.body`, `res.locals.query` and `res.locals.params` (Express 5's `req.query` is read-only).
 * Every invalid field is reported at once, each with its path.
 */
export function validate(schemas: RequestSchemas) {
  return (req: Request, res: Response, next: NextFunction): void => {
    // Multipart text fields arrive after the app-wide check, so they are checked here too.
    const unsafe = schemas.body ? unsafeTextFields(req.body) : [];
    if (unsafe.length) return next(refuseUnsafeText('request body', unsafe));
    const errors: FieldError[] = [];
    const where: string[] = [];
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const input = part === 'body' ? (req.body ?? {}) : req[part];
      const result = schema.safeParse(input);
      if (result.success) {
        res.locals[part] = result.data;
      } else {
        errors.push(...fieldErrors(result.error));
        where.push(WHERE[part]);
      }
    }
    if (errors.length) {
      const list = errors.map((e) => `${fieldInWords(e.field)} ${e.message}`).join('; ');
      next(ApiError.badRequest(`The ${where.join(' and ')} has ${errors.length === 1 ? 'an invalid field' : `${errors.length} invalid fields`}: ${list}.`, errors));
      return;
    }
    next();
  };
}
