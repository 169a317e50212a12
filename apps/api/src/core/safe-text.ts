import type { NextFunction, Request, Response } from 'express';
import { fieldInWords, type FieldError } from '@ohmprint/contracts';
import { ApiError } from './api-error';

/** A UTF-16 surrogate without its partner: no character at all, and PostgreSQL cannot store it. */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
const MAX_DEPTH = 64;

function problemOf(text: string): string | null {
  if (text.includes('\u0000')) return 'must not contain a NUL character (\\u0000)';
  if (LONE_SURROGATE.test(text)) return 'must not contain an unpaired UTF-16 surrogate (not a character)';
  return null;
}

/**
 * Every string (and object key) in `value` that PostgreSQL's text and jsonb cannot hold: NUL
 * characters and lone surrogates. Each is named by its path, e.g. `remarks` or `items.2.name`.
 */
export function unsafeTextFields(value: unknown, prefix = '', depth = 0, found: FieldError[] = []): FieldError[] {
  if (found.length >= 20 || depth > MAX_DEPTH) return found;
  if (typeof value === 'string') {
    const problem = problemOf(value);
    if (problem) found.push({ field: prefix || '(root)', message: problem });
  } else if (Array.isArray(value)) {
    value.forEach((item, i) => unsafeTextFields(item, prefix ? `${prefix}.${i}` : String(i), depth + 1, found));
  } else if (value && typeof value === 'object' && !Buffer.isBuffer(value)) {
    for (const [key, item] of Object.entries(value)) {
      const path = prefix ? `${prefix}.${key}` : key;
      const keyProblem = problemOf(key);
      if (keyProblem) found.push({ field: path, message: `(the name) ${keyProblem}` });
      else unsafeTextFields(item, path, depth + 1, found);
    }
  }
  return found;
}

/** The 400 for text that cannot be stored, naming each field and where it was sent. */
export function refuseUnsafeText(where: string, errors: FieldError[]): ApiError {
  const list = errors.map((e) => `${fieldInWords(e.field)} ${e.message}`).join('; ');
  return new ApiError(400, 'Invalid text', `The ${where} has text that cannot be stored: ${list}.`, { type: 'invalid-text', errors });
}

/** Refuses NUL characters and lone surrogates anywhere in the query string or a JSON body. */
export function rejectUnsafeText(req: Request, _res: Response, next: NextFunction): void {
  const inQuery = unsafeTextFields(req.query);
  if (inQuery.length) return next(refuseUnsafeText('query string', inQuery));
  const inBody = unsafeTextFields(req.body);
  if (inBody.length) return next(refuseUnsafeText('request body', inBody));
  let path = req.path;
  try {
    path = decodeURIComponent(req.path);
  } catch {
    // a malformed escape is the router's 404, not ours
  }
  const inPath = problemOf(path);
  if (inPath) return next(refuseUnsafeText('URL', [{ field: '(path)', message: inPath }]));
  next();
}
