import { InjectionToken } from '@angular/core';
import type { Role } from '@ohmprint/contracts';

/** What a portal tells the shared pieces about itself. */
export interface PortalConfig {
  readonly kind: 'lab' | 'client';
  /** Shown in the toolbar and on the sign-in card, e.g. "Lab portal". */
  readonly title: string;
  /** Roles that may use this portal; anyone else is pointed to the other one. */
  readonly acceptedRoles: readonly Role[];
  /** Where people with the other kind of account go. `url` is an absolute path on the same host. */
  readonly otherPortal: { readonly title: string; readonly url: string };
}

export const PORTAL = new InjectionToken<PortalConfig>('ohm.portal');
