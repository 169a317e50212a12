import { Injectable, inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ApiProblem } from './api-problem';

/** The one place feedback reaches the user: a snack bar at the bottom of the page. */
@Injectable({ providedIn: 'root' })
export class Notifier {
  private readonly snackBar = inject(MatSnackBar);

  success(message: string): void {
    this.snackBar.open(message, 'OK', { duration: 4000, politeness: 'polite' });
  }

  error(message: string): void {
    this.snackBar.open(message, 'Dismiss', { duration: 10000, politeness: 'assertive', panelClass: 'ohm-snack-error' });
  }

  problem(problem: ApiProblem): void {
    this.error(problem.summary);
  }
}
