import { ErrorHandler, Injectable, inject } from '@angular/core';
import { ApiProblem } from './api-problem';
import { Notifier } from './notifier';

/** Uncaught errors still reach the user (through the same snack bar) instead of failing silently. */
@Injectable()
export class PortalErrorHandler implements ErrorHandler {
  private readonly notifier = inject(Notifier);

  handleError(error: unknown): void {
    // API problems were already reported by the problem interceptor.
    if (error instanceof ApiProblem) return;
    console.error(error);
    this.notifier.error('Something went wrong on this page. Reload it to try again.');
  }
}
