import { STATUS_CODES } from 'node:http';
import type { NextFunction, Request, Response } from 'express';
import type { Problem } from '@ohmprint/contracts';
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

const CONNECTION_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'ENOTFOUND', 'EAI_AGAIN', 'EHOSTUNREACH']);
const CONNECTION_MESSAGES = /Connection terminated|terminating connection|is not currently accepting connections|the database system is (starting up|shutting down|in recovery)|timeout exceeded when trying to connect|Client has encountered a connection error|Connection ended|not queryable/i;

/**
 * True when the database could not be reached or dropped the connection (a restart, a failover,
 * a full connection table): a moment's outage, answered 503 with Retry-After instead of 500.
 * SQLSTATE class 08 is "connection exception", 57P01–57P03 a shutdown or a server still starting,
 * 53300 too many connections.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  for (let e = err as { code?: unknown; message?: unknown; driverError?: unknown; cause?: unknown } | undefined, depth = 0; e && depth < 4; depth++) {
    const code = typeof e.code === 'string' ? e.code : '';
    if (CONNECTION_CODES.has(code) || code.startsWith('08') || ['57P01', '57P02', '57P03', '53300'].includes(code)) return true;
    if (typeof e.message === 'string' && CONNECTION_MESSAGES.test(e.message)) return true;
    e = (e.driverError ?? e.cause) as typeof e;
  }
  return false;
}

const RETRY_AFTER_SECONDS = 5;

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
  } else if (isDatabaseUnavailable(err)) {
    logger.warn({ err, requestId }, 'database unavailable');
    res.setHeader('Retry-After', String(RETRY_AFTER_SECONDS));
    problem = {
      type: 'urn:ohmprint:problem:service-unavailable',
      title: 'Service briefly unavailable',
      status: 503,
      detail: `The database cannot be reached at the moment; nothing was changed by this request. Try again in ${RETRY_AFTER_SECONDS} seconds (request id ${requestId}).`,
      requestId,
    };
  } else {
    // The message of an unexpected error (often the database's own words, naming tables and
    // constraints) goes to the log only, in every environment; the caller gets the request id.
    logger.error({ err, requestId }, 'unhandled error');
    problem = {
      type: 'about:blank',
      title: 'Internal error',
      status: 500,
      detail: `Something went wrong on our side. Quote request id ${requestId} when reporting it.`,
      requestId,
    };
  }
  if (res.headersSent) {
    res.destroy();
    return;
  }
  res.status(problem.status).type('application/problem+json').send(JSON.stringify(problem));
}
