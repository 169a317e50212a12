import { MatPaginatorIntl } from '@angular/material/paginator';
import { CappedPaginatorIntl } from '../lists/capped-paginator-intl';
import { provideHttpClient, withFetch, withInterceptors } from '@angular/common/http';
import {
  ErrorHandler,
  inject,
  makeEnvironmentProviders,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
  type EnvironmentProviders,
} from '@angular/core';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS } from '@angular/material/form-field';
import { MatIconRegistry } from '@angular/material/icon';
import { MAT_SNACK_BAR_DEFAULT_OPTIONS } from '@angular/material/snack-bar';
import { provideRouter, withComponentInputBinding, withInMemoryScrolling, type Routes } from '@angular/router';
import { Session } from '../auth/session';
import { tokenInterceptor } from '../auth/token-interceptor';
import { PortalErrorHandler } from '../errors/portal-error-handler';
import { problemInterceptor } from '../errors/problem-interceptor';
import { ThemeMode } from '../shell/theme-mode';
import { NAV_ITEMS, type NavItem } from '../shell/nav-item';
import { PORTAL, type PortalConfig } from './portal-config';

/** Everything a portal needs at the root, in one call from its app.config.ts. */
export function providePortal(config: PortalConfig, routes: Routes, nav: readonly NavItem[]): EnvironmentProviders {
  return makeEnvironmentProviders([
    provideZonelessChangeDetection(),
    provideBrowserGlobalErrorListeners(),
    provideRouter(routes, withComponentInputBinding(), withInMemoryScrolling({ scrollPositionRestoration: 'top' })),
    // The problem interceptor is outermost so it sees the final outcome after any token refresh.
    provideHttpClient(withFetch(), withInterceptors([problemInterceptor, tokenInterceptor])),
    { provide: PORTAL, useValue: config },
    { provide: NAV_ITEMS, useValue: nav },
    { provide: ErrorHandler, useClass: PortalErrorHandler },
    { provide: MatPaginatorIntl, useClass: CappedPaginatorIntl },
    { provide: MAT_FORM_FIELD_DEFAULT_OPTIONS, useValue: { appearance: 'outline', subscriptSizing: 'dynamic' } },
    { provide: MAT_SNACK_BAR_DEFAULT_OPTIONS, useValue: { duration: 5000, horizontalPosition: 'center', verticalPosition: 'bottom' } },
    provideAppInitializer(() => {
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined', 'mat-ligature-font');
      inject(ThemeMode).apply();
      return inject(Session).restore();
    }),
  ]);
}
