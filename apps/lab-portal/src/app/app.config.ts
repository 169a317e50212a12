import type { ApplicationConfig } from '@angular/core';
import { providePortal } from '@ohmprint/ui';
import { routes } from './app.routes';
import { LAB_NAV } from './nav';
import { LAB_PORTAL } from './portal';

export const appConfig: ApplicationConfig = {
  providers: [providePortal(LAB_PORTAL, routes, LAB_NAV)],
};
