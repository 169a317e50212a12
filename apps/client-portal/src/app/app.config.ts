import type { ApplicationConfig } from '@angular/core';
import { providePortal } from '@ohmprint/ui';
import { routes } from './app.routes';
import { CLIENT_NAV } from './nav';
import { CLIENT_PORTAL } from './portal';

export const appConfig: ApplicationConfig = {
  providers: [providePortal(CLIENT_PORTAL, routes, CLIENT_NAV)],
};
