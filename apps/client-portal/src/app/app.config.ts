import type { ApplicationConfig } from '@angular/core';
import { TOOLBAR_ITEMS, providePortal } from '@ohmprint/ui';
import { NotificationBell } from './notifications/notification-bell';
import { routes } from './app.routes';
import { CLIENT_NAV } from './nav';
import { CLIENT_PORTAL } from './portal';

export const appConfig: ApplicationConfig = {
  providers: [providePortal(CLIENT_PORTAL, routes, CLIENT_NAV), { provide: TOOLBAR_ITEMS, useValue: [NotificationBell] }],
};
