import { STATUS_CODES } from 'node:http';
import type { NextFunction, Request, Response } from 'express';
import type { Problem } from '@ohmprint/contracts';
import { config } from '../config';
import { ApiError } from './api-error';
import { logger } from './logger';

interface BodyParserError extends Error {
  type?: string;
  status?: number;
  limit?: number;
}

/** body-parser's own errors become clear problems instead of HTML pages. */
function fromBodyParser(err: BodyParserError): ApiError | undefined {
  switch (err.type) {
    case 'entity.parse.failed':
      return new ApiError(400, 'Malformed JSON', `The request body is not valid JSON: ${err.message}.`, { type: 'malformed-json' });
    case 'entity.too.large':
      return new ApiError(413, 'Request body too large', `The request body is larger than the limit of ${err.limit} bytes.`, { type: 'body-too-large' });
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new ApiError(415, 'Unsupported encoding', err.message, { type: 'unsupported-encoding' });
    default:
      return fromClientStatus(err);
  }
}

/** Errors from Express's own helpers (e.g. a static file that vanished) carry a 4xx status. */
function fromClientStatus(err: BodyParserError & { statusCode?: number; expose?: boolean }): ApiError | undefined {
  const status = err?.status ?? err?.statusCode;
  if (typeof status !== 'number' || status < 400 || status > 499) return undefined;
  const title = STATUS_CODES[status] ?? 'Client error';
  return new ApiError(status, title, err.expose ? err.message : `${title}.`);
}

export function notFoundHandler(req: Request, _res: Response, next: NextFunction): void {
  next(new ApiError(404, 'Not found', `There is no ${req.method} ${req.originalUrl.split('?')[0]} in this API.`, { type: 'no-such-route' }));
}

/** The one place errors become responses: `application/problem+json`, with the request id. */
export function errorMiddleware(err: unknown, req: Request, res: Response, _next: NextFunction): void {
  const known = err instanceof ApiError ? err : fromBodyParser(err as BodyParserError);
  const requestId = String(req.id ?? '');
  let problem: Problem;
  if (known) {
    problem = { ...known.extensions, type: known.type, title: known.title, status: known.status, detail: known.detail, requestId };
    if (known.errors?.length) problem.errors = known.errors;
    for (const [name, value] of Object.entries(known.headers ?? {})) res.setHeader(name, value);
    if (known.status >= 500) logger.error({ err, requestId }, known.title);
  } else {
    logger.error({ err, requestId }, 'unhandled error');
    problem = {
      type: 'about:blank',
      title: 'Internal error',
      status: 500,
      detail: config.production
        ? `Something went wrong on our side. Quote request id ${requestId} when reporting it.`
        : `${(err as Error)?.message ?? String(err)} (request id ${requestId})`,
      requestId,
    };
  }
  if (res.headersSent) {
    res.destroy();
    return;
  }
  res.status(problem.status).type('application/problem+json').send(JSON.stringify(problem));
}
