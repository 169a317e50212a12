import { InjectionToken } from '@angular/core';
import type { Role } from '@ohmprint/contracts';

/** One entry of the side navigation. Without `roles` everyone signed in sees it. */
export interface NavItem {
  readonly label: string;
  /** A Material Symbols ligature name, e.g. `science`. */
  readonly icon: string;
  /** Router path relative to the portal's base href, e.g. `/staff`. */
  readonly path: string;
  readonly roles?: readonly Role[];
  /** Match only the exact path (the home entry). */
  readonly exact?: boolean;
}

export const NAV_ITEMS = new InjectionToken<readonly NavItem[]>('ohm.nav-items');

export function visibleNavItems(items: readonly NavItem[], roles: readonly Role[]): NavItem[] {
  return items.filter((item) => !item.roles || item.roles.some((r) => roles.includes(r)));
}
