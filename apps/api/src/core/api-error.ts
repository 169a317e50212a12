import type { FieldError } from '@ohmprint/contracts';

export interface ApiErrorOptions {
  /** Short kebab-case name of the problem kind; becomes `urn:ohmprint:problem:<type>`. */
  type?: string;
  errors?: FieldError[];
  /** Extra headers for the response (e.g. WWW-Authenticate). */
  headers?: Record<string, string>;
  /** Extension members of the problem (RFC 9457 §3.2), e.g. `{ shortfall: 3 }`: figures a client acts on. */
  extensions?: Record<string, string | number | boolean | null>;
}

/**
 * The one error type services throw. Operational errors (bad input, missing rights, conflicts)
 * carry a message fit for the user; anything else is a programmer error whose details stay in the log.
 */
export class ApiError extends Error {
  readonly isOperational = true;
  readonly type: string;
  readonly errors?: FieldError[];
  readonly headers?: Record<string, string>;
  readonly extensions?: Record<string, string | number | boolean | null>;

  constructor(
    readonly status: number,
    readonly title: string,
    readonly detail?: string,
    options: ApiErrorOptions = {},
  ) {
    super(detail ?? title);
    this.name = 'ApiError';
    this.type = options.type ? `urn:ohmprint:problem:${options.type}` : 'about:blank';
    this.errors = options.errors;
    this.headers = options.headers;
    this.extensions = options.extensions;
  }

  static badRequest(detail: string, errors?: FieldError[]): ApiError {
    return new ApiError(400, 'Invalid request', detail, { type: 'invalid-request', errors });
  }

  static unauthorized(detail: string): ApiError {
    return new ApiError(401, 'Not signed in', detail, { type: 'unauthorized', headers: { 'WWW-Authenticate': 'Bearer' } });
  }

  static forbidden(detail: string): ApiError {
    return new ApiError(403, 'Not allowed', detail, { type: 'forbidden' });
  }

  /** Also the answer for another tenant's resource, so its existence is not revealed. */
  static notFound(what: string): ApiError {
    return new ApiError(404, 'Not found', `${what} was not found.`, { type: 'not-found' });
  }

  static conflict(detail: string, errors?: FieldError[]): ApiError {
    return new ApiError(409, 'Conflict', detail, { type: 'conflict', errors });
  }

  static gone(detail: string): ApiError {
    return new ApiError(410, 'No longer valid', detail, { type: 'gone' });
  }
}
