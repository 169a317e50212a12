import { HttpErrorResponse, type HttpInterceptorFn, type HttpRequest } from '@angular/common/http';
import { inject } from '@angular/core';
import { catchError, switchMap, throwError } from 'rxjs';
import { NO_AUTH } from '../errors/request-context';
import { Session } from './session';

function withToken<T>(req: HttpRequest<T>, token: string | null): HttpRequest<T> {
  return token ? req.clone({ setHeaders: { Authorization: `Bearer ${token}` } }) : req;
}

/**
 * Attaches the access token to API calls. On a 401 it refreshes once (shared by every request that
 * failed meanwhile) and retries; if the refresh fails the session ends and the user signs in again.
 */
export const tokenInterceptor: HttpInterceptorFn = (req, next) => {
  if (!req.url.startsWith('/api/') || req.context.get(NO_AUTH)) return next(req);
  const session = inject(Session);
  const sentWith = session.accessToken();
  return next(withToken(req, sentWith)).pipe(
    catchError((error: unknown) => {
      if (!(error instanceof HttpErrorResponse) || error.status !== 401 || !sentWith) {
        return throwError(() => error);
      }
      const current = session.accessToken();
      // Another request already refreshed while this one was in flight.
      if (current && current !== sentWith) return next(withToken(req, current));
      return session.refresh().pipe(
        catchError(() => {
          session.expire();
          return throwError(() => error);
        }),
        switchMap((fresh) => next(withToken(req, fresh))),
      );
    }),
  );
};
