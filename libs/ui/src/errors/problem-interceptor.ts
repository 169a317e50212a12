import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { catchError, throwError } from 'rxjs';
import { ApiProblem } from './api-problem';
import { Notifier } from './notifier';
import { QUIET } from './request-context';

/**
 * Turns every failed request into an ApiProblem and reports it once through the Notifier,
 * unless the caller marked the request QUIET to show the error inline.
 */
export const problemInterceptor: HttpInterceptorFn = (req, next) => {
  const notifier = inject(Notifier);
  return next(req).pipe(
    catchError((error: unknown) => {
      if (!(error instanceof HttpErrorResponse)) return throwError(() => error);
      const problem = ApiProblem.from(error);
      if (!req.context.get(QUIET)) notifier.problem(problem);
      return throwError(() => problem);
    }),
  );
};
