import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import type { Role } from '@ohmprint/contracts';
import { Notifier } from '../errors/notifier';
import { ROLE_LABELS } from './role-labels';
import { Session } from './session';

/** Lets signed-in users through; everyone else goes to sign-in and comes back afterwards. */
export const signedInGuard: CanActivateFn = (_route, state) => {
  const session = inject(Session);
  if (session.signedIn()) return true;
  return inject(Router).createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
};

/** Sign-in and friends are pointless once signed in: go home instead. */
export const signedOutGuard: CanActivateFn = () => {
  const session = inject(Session);
  return session.signedIn() ? inject(Router).createUrlTree(['/']) : true;
};

/** Lets through users who hold at least one of the roles; says why when it turns someone away. */
export function roleGuard(...roles: Role[]): CanActivateFn {
  return (_route, state) => {
    const session = inject(Session);
    const router = inject(Router);
    if (!session.signedIn()) return router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
    if (session.hasAnyRole(roles)) return true;
    const allowed = roles.map((r) => ROLE_LABELS[r].toLowerCase());
    const who = allowed.length > 1 ? `${allowed.slice(0, -1).join(', ')} or ${allowed.at(-1)}` : allowed[0];
    inject(Notifier).error(`That page is for the ${who} role; your account does not hold it.`);
    return router.createUrlTree(['/']);
  };
}
