import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import { TEST_CLIENT_PORTAL, provideTestPortal, testClientUser, testUser } from '../testing/portal-testing';
import { Session, WrongPortalError } from './session';

describe('Session', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('keeps the access token in memory after signing in, and nowhere else', async () => {
    TestBed.configureTestingModule({ providers: provideTestPortal() });
    const session = TestBed.inject(Session);
    const signedIn = firstValueFrom(session.signIn('analyst@calder.test', 'ohmprint-demo-2026'));
    const req = TestBed.inject(HttpTestingController).expectOne('/api/auth/sign-in');
    expect(req.request.body).toEqual({ email: 'analyst@calder.test', password: 'ohmprint-demo-2026' });
    expect(req.request.withCredentials).toBe(true);
    req.flush({ accessToken: 'tok', user: testUser() });
    await expect(signedIn).resolves.toMatchObject({ email: 'analyst@calder.test' });
    expect(session.accessToken()).toBe('tok');
    expect(session.organisationName()).toBe('Calder Analytical');
    expect(localStorage.length + sessionStorage.length).toBe(0);
  });

  it('refuses a client account on the lab portal and keeps no session', async () => {
    TestBed.configureTestingModule({ providers: provideTestPortal() });
    const session = TestBed.inject(Session);
    const signedIn = firstValueFrom(session.signIn('member@hollinridge.test', 'ohmprint-demo-2026'));
    TestBed.inject(HttpTestingController).expectOne('/api/auth/sign-in').flush({ accessToken: 'tok', user: testClientUser() });
    await expect(signedIn).rejects.toBeInstanceOf(WrongPortalError);
    expect(session.signedIn()).toBe(false);
    expect(session.accessToken()).toBeNull();
    expect(session.otherPortalAccount()?.clientOrganisation?.name).toBe('Hollin Ridge Cellars');
  });

  it('refuses lab staff on the client portal', async () => {
    TestBed.configureTestingModule({ providers: provideTestPortal({ portal: TEST_CLIENT_PORTAL }) });
    const session = TestBed.inject(Session);
    const signedIn = firstValueFrom(session.signIn('analyst@calder.test', 'x'));
    TestBed.inject(HttpTestingController).expectOne('/api/auth/sign-in').flush({ accessToken: 'tok', user: testUser() });
    await expect(signedIn).rejects.toBeInstanceOf(WrongPortalError);
    expect(session.signedIn()).toBe(false);
  });

  it('restores a session from the refresh cookie on load', async () => {
    TestBed.configureTestingModule({ providers: provideTestPortal() });
    const session = TestBed.inject(Session);
    const restored = session.restore();
    TestBed.inject(HttpTestingController).expectOne('/api/auth/refresh').flush({ accessToken: 'tok', user: testUser() });
    await restored;
    expect(session.user()?.displayName).toBe('Test Analyst');
  });

  it('starts signed out, without an error, when there is no refresh cookie', async () => {
    TestBed.configureTestingModule({ providers: provideTestPortal() });
    const session = TestBed.inject(Session);
    const restored = session.restore();
    TestBed.inject(HttpTestingController)
      .expectOne('/api/auth/refresh')
      .flush({ type: 'about:blank', title: 'Unauthorized', status: 401, detail: 'No sign-in session cookie was sent; sign in again.' }, { status: 401, statusText: 'Unauthorized' });
    await expect(restored).resolves.toBeUndefined();
    expect(session.signedIn()).toBe(false);
  });
});
