import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { Session } from '../auth/session';
import { provideTestPortal, testUser } from '../testing/portal-testing';
import { AppShell } from './app-shell';
import type { NavItem } from './nav-item';

const nav: NavItem[] = [
  { label: 'Home', icon: 'home', path: '/', exact: true },
  { label: 'Staff', icon: 'group', path: '/staff', roles: ['lab-admin'] },
  { label: 'Work queue', icon: 'inbox', path: '/queue', roles: ['analyst', 'intake-technician'] },
  { label: 'Labs', icon: 'domain', path: '/labs', roles: ['platform-operator'] },
];

async function openAs(roles: NonNullable<Parameters<typeof testUser>[0]>['roles']) {
  TestBed.configureTestingModule({
    providers: provideTestPortal({
      nav,
      routes: [
        { path: 'sign-in', children: [] },
        { path: '', component: AppShell, children: [{ path: '**', children: [] }] },
      ],
    }),
  });
  TestBed.inject(Session).adopt({ accessToken: 'tok', user: testUser({ roles }) });
  const harness = await RouterTestingHarness.create('/');
  return { harness, loader: TestbedHarnessEnvironment.loader(harness.fixture) };
}

function navLabels(root: HTMLElement): string[] {
  return [...root.querySelectorAll('mat-nav-list a [matListItemTitle]')].map((title) => title.textContent?.trim() ?? '');
}

describe('AppShell', () => {
  it('shows each navigation entry only to the roles it names', async () => {
    const { harness } = await openAs(['analyst']);
    expect(navLabels(harness.routeNativeElement as HTMLElement)).toEqual(['Home', 'Work queue']);
  });

  it('shows the lab name and the signed-in person in the toolbar', async () => {
    const { harness } = await openAs(['lab-admin', 'reviewer']);
    const root = harness.routeNativeElement as HTMLElement;
    expect(navLabels(root)).toEqual(['Home', 'Staff']);
    expect(root.querySelector('.organisation')?.textContent?.trim()).toBe('Calder Analytical');
    expect(root.querySelector('.user-button')?.getAttribute('aria-label')).toBe('Account menu for Test Analyst');
  });

  it('signs out from the account menu and returns to sign-in', async () => {
    const { harness, loader } = await openAs(['analyst']);
    const menu = await loader.getHarness(MatMenuHarness);
    await menu.open();
    await menu.clickItem({ text: /Sign out/ });
    TestBed.inject(HttpTestingController).expectOne('/api/auth/sign-out').flush(null, { status: 204, statusText: 'No Content' });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Session).signedIn()).toBe(false);
    expect(TestBed.inject(Router).url).toBe('/sign-in?signedOut=1');
  });
});
