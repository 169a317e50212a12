import type { FormGroup } from '@angular/forms';
import type { ApiProblem } from './api-problem';

/**
 * Puts the server's field errors on the matching controls (`server` error key), so they show
 * inline beside what the user typed. Dotted fields (`firstAdmin.email`) follow nested groups;
 * `aliases` maps an API field name to a differently named control.
 */
export function showFieldErrors(form: FormGroup, problem: ApiProblem, aliases: Readonly<Record<string, string>> = {}): void {
  for (const { field, message } of problem.fieldErrors) {
    const control = form.get(aliases[field] ?? field);
    if (!control) continue;
    control.setErrors({ ...control.errors, server: message });
    control.markAsTouched();
  }
}
