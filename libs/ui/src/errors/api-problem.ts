import { HttpErrorResponse } from '@angular/common/http';
import { ProblemSchema, type FieldError } from '@ohmprint/contracts';

/**
 * Every failed API call becomes one of these, whatever the server or network sent, so screens
 * have a single shape to show: a sentence for the snack bar and field errors for the form.
 */
export class ApiProblem extends Error {
  constructor(
    readonly status: number,
    readonly title: string,
    readonly detail: string | undefined,
    readonly fieldErrors: readonly FieldError[] = [],
    /** The whole problem document, extension members included (e.g. `{ problem: 'other-sample' }`). */
    readonly members: Readonly<Record<string, unknown>> = {},
  ) {
    super(detail ?? title);
    this.name = 'ApiProblem';
  }

  /** The sentence people read. */
  get summary(): string {
    if (this.fieldErrors.length > 0 && !this.detail) return `${this.title}: check the highlighted fields.`;
    return this.detail ?? this.title;
  }

  static from(error: unknown): ApiProblem {
    if (error instanceof ApiProblem) return error;
    if (!(error instanceof HttpErrorResponse)) {
      return new ApiProblem(0, 'Unexpected error', error instanceof Error ? error.message : String(error));
    }
    if (error.status === 0) {
      return new ApiProblem(0, 'No connection', 'The Ohmprint server could not be reached. Check your connection and try again.');
    }
    const parsed = ProblemSchema.safeParse(error.error);
    if (parsed.success) {
      const p = parsed.data;
      return new ApiProblem(p.status, p.title, p.detail, p.errors ?? [], p);
    }
    return new ApiProblem(error.status, fallbackTitle(error.status), `The server answered ${error.status} ${error.statusText || ''}`.trim() + '.');
  }
}

function fallbackTitle(status: number): string {
  if (status === 401) return 'Not signed in';
  if (status === 403) return 'Not allowed';
  if (status === 404) return 'Not found';
  if (status >= 500) return 'Server error';
  return 'Request failed';
}
