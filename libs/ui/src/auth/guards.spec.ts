import { TestBed } from '@angular/core/testing';
import { Router, UrlTree, type ActivatedRouteSnapshot, type RouterStateSnapshot } from '@angular/router';
import { provideTestPortal, testUser } from '../testing/portal-testing';
import { Notifier } from '../errors/notifier';
import { roleGuard, signedInGuard } from './guards';
import { Session } from './session';

const route = {} as ActivatedRouteSnapshot;
const state = { url: '/staff?page=2' } as RouterStateSnapshot;

function run(guard: typeof signedInGuard) {
  return TestBed.runInInjectionContext(() => guard(route, state));
}

function serialise(result: unknown): string {
  expect(result).toBeInstanceOf(UrlTree);
  return TestBed.inject(Router).serializeUrl(result as UrlTree);
}

describe('route guards', () => {
  beforeEach(() => TestBed.configureTestingModule({ providers: provideTestPortal() }));

  it('sends a signed-out visitor to sign in, remembering where they were going', () => {
    expect(serialise(run(signedInGuard))).toBe('/sign-in?returnUrl=%2Fstaff%3Fpage%3D2');
  });

  it('lets a signed-in user through', () => {
    TestBed.inject(Session).adopt({ accessToken: 't', user: testUser() });
    expect(run(signedInGuard)).toBe(true);
  });

  it('lets through a user holding any one of the roles', () => {
    TestBed.inject(Session).adopt({ accessToken: 't', user: testUser({ roles: ['analyst', 'lab-admin'] }) });
    expect(run(roleGuard('lab-admin'))).toBe(true);
    expect(run(roleGuard('reviewer', 'analyst'))).toBe(true);
  });

  it('turns away a user without the role and sends them home', () => {
    TestBed.inject(Session).adopt({ accessToken: 't', user: testUser({ roles: ['analyst'] }) });
    expect(serialise(run(roleGuard('lab-admin')))).toBe('/');
  });

  it('names the roles a page is for in words, not codes', () => {
    TestBed.inject(Session).adopt({ accessToken: 't', user: testUser({ roles: ['platform-operator'] }) });
    const error = jest.spyOn(TestBed.inject(Notifier), 'error');
    run(roleGuard('intake-technician', 'analyst', 'lab-admin'));
    expect(error).toHaveBeenCalledWith('That page is for the intake technician, analyst or lab admin role; your account does not hold it.');
  });

  it('sends a signed-out visitor of a role-guarded page to sign in', () => {
    expect(serialise(run(roleGuard('lab-admin')))).toMatch(/^\/sign-in\?returnUrl=/);
  });
});
