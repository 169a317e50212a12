import { InjectionToken, type Type } from '@angular/core';

/**
 * Components a portal adds to the shell's toolbar, beside the account menu, for signed-in users
 * (the client portal's notification bell). None by default.
 */
export const TOOLBAR_ITEMS = new InjectionToken<readonly Type<unknown>[]>('ohm.toolbar-items', { factory: () => [] });
