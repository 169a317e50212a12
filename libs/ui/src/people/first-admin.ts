import { Validators, type NonNullableFormBuilder } from '@angular/forms';

/** The first admin a new tenant's invitation goes to: an e-mail and, if known, a name. */
export function firstAdminForm(fb: NonNullableFormBuilder) {
  return fb.group({
    email: ['', [Validators.required, Validators.email]],
    displayName: ['', Validators.maxLength(120)],
  });
}

/** The request's `firstAdmin`, leaving out a blank name (the invitee then chooses one). */
export function firstAdminOf(value: { readonly email: string; readonly displayName: string }): { email: string; displayName?: string } {
  return { email: value.email, ...(value.displayName ? { displayName: value.displayName } : {}) };
}
