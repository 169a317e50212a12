import { signal } from '@angular/core';
import type { FormGroup } from '@angular/forms';
import type { Observable } from 'rxjs';
import { ApiProblem } from './api-problem';
import { showFieldErrors } from './form-problems';

/**
 * One form's trip to the API, as every dialog form makes it: an invalid form is only marked
 * touched (so its errors show), a refused request keeps what was typed and shows the problem's
 * summary plus its field errors beside the controls.
 */
export class FormSubmission {
  readonly saving = signal(false);
  readonly problem = signal<ApiProblem | null>(null);

  constructor(private readonly form: FormGroup) {}

  submit<T>(request: () => Observable<T>, done: (answer: T) => void): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.problem.set(null);
    request().subscribe({
      next: done,
      error: (error: unknown) => {
        const problem = ApiProblem.from(error);
        this.saving.set(false);
        this.problem.set(problem);
        showFieldErrors(this.form, problem);
      },
    });
  }
}
