import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import type { EnvironmentProviders, Provider } from '@angular/core';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter, withComponentInputBinding, type Routes } from '@angular/router';
import { CLIENT_ROLES, LAB_ROLES, type Me } from '@ohmprint/contracts';
import { tokenInterceptor } from '../auth/token-interceptor';
import { problemInterceptor } from '../errors/problem-interceptor';
import type { PortalConfig } from '../portal/portal-config';
import { PORTAL } from '../portal/portal-config';
import { NAV_ITEMS, type NavItem } from '../shell/nav-item';

export const TEST_LAB_PORTAL: PortalConfig = {
  kind: 'lab',
  title: 'Lab portal',
  acceptedRoles: ['platform-operator', ...LAB_ROLES],
  otherPortal: { title: 'Client portal', url: '/' },
};

export const TEST_CLIENT_PORTAL: PortalConfig = {
  kind: 'client',
  title: 'Client portal',
  acceptedRoles: CLIENT_ROLES,
  otherPortal: { title: 'Lab portal', url: '/lab/' },
};

/** The root providers a portal has, with HttpTestingController in place of the network. */
export function provideTestPortal(
  options: { portal?: PortalConfig; routes?: Routes; nav?: readonly NavItem[] } = {},
): (Provider | EnvironmentProviders)[] {
  return [
    provideRouter(options.routes ?? [], withComponentInputBinding()),
    provideHttpClient(withInterceptors([problemInterceptor, tokenInterceptor])),
    provideHttpClientTesting(),
    { provide: PORTAL, useValue: options.portal ?? TEST_LAB_PORTAL },
    { provide: NAV_ITEMS, useValue: options.nav ?? [] },
    { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
  ];
}

/** Invented accounts for tests (ids are fixed UUIDs so schema parsing passes). */
export const LAB_ID = '0b8e6a52-2f5e-4c1b-9d0a-1f2e3d4c5b6a';
export const ORG_ID = '6c1d2e3f-4a5b-4c6d-8e7f-9a0b1c2d3e4f';

export function testUser(overrides: Partial<Me> = {}): Me {
  return {
    id: '3f2b1c0d-9e8f-4a7b-8c6d-5e4f3a2b1c0d',
    email: 'analyst@calder.test',
    displayName: 'Test Analyst',
    roles: ['analyst'],
    lab: { id: LAB_ID, name: 'Calder Analytical' },
    clientOrganisation: null,
    ...overrides,
  };
}

export function testClientUser(overrides: Partial<Me> = {}): Me {
  return testUser({
    id: '9a8b7c6d-5e4f-4a3b-9c2d-1e0f9a8b7c6d',
    email: 'member@hollinridge.test',
    displayName: 'Test Member',
    roles: ['client-member'],
    clientOrganisation: { id: ORG_ID, name: 'Hollin Ridge Cellars' },
    ...overrides,
  });
}
