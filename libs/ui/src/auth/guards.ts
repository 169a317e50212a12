import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import type { Role } from '@ohmprint/contracts';
import { Notifier } from '../errors/notifier';
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
    inject(Notifier).error(`That page needs the ${roles.join(' or ')} role. Ask your lab admin if you need it.`);
    return router.createUrlTree(['/']);
  };
}
