import { HttpClient } from '@angular/common/http';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { provideTestPortal, testUser } from '../testing/portal-testing';
import { Session } from './session';

function setUp() {
  TestBed.configureTestingModule({ providers: provideTestPortal() });
  const http = TestBed.inject(HttpClient);
  const backend = TestBed.inject(HttpTestingController);
  const session = TestBed.inject(Session);
  session.adopt({ accessToken: 'old-token', user: testUser() });
  return { http, backend, session };
}

const unauthorised = { status: 401, statusText: 'Unauthorized' };
const problem401 = { type: 'about:blank', title: 'Unauthorized', status: 401, detail: 'The access token has expired.' };

describe('tokenInterceptor', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('sends the access token with API calls, and none with sign-in', () => {
    const { http, backend } = setUp();
    http.get('/api/lab/staff').subscribe();
    expect(backend.expectOne('/api/lab/staff').request.headers.get('Authorization')).toBe('Bearer old-token');
    TestBed.inject(Session).signIn('a@b.test', 'pw').subscribe({ error: () => undefined });
    expect(backend.expectOne('/api/auth/sign-in').request.headers.has('Authorization')).toBe(false);
  });

  it('refreshes once on 401 and retries the request with the new token', async () => {
    const { http, backend } = setUp();
    const answer = firstValueFrom(http.get<{ ok: boolean }>('/api/me'));
    backend.expectOne('/api/me').flush(problem401, unauthorised);
    backend.expectOne('/api/auth/refresh').flush({ accessToken: 'new-token', user: testUser() });
    const retry = backend.expectOne('/api/me');
    expect(retry.request.headers.get('Authorization')).toBe('Bearer new-token');
    retry.flush({ ok: true });
    await expect(answer).resolves.toEqual({ ok: true });
  });

  it('shares one refresh between requests that fail at the same time', async () => {
    const { http, backend } = setUp();
    const first = firstValueFrom(http.get('/api/lab/staff'));
    const second = firstValueFrom(http.get('/api/lab/client-organisations'));
    backend.expectOne('/api/lab/staff').flush(problem401, unauthorised);
    backend.expectOne('/api/lab/client-organisations').flush(problem401, unauthorised);
    // expectOne fails if a second refresh was sent.
    backend.expectOne('/api/auth/refresh').flush({ accessToken: 'new-token', user: testUser() });
    const retries = [backend.expectOne('/api/lab/staff'), backend.expectOne('/api/lab/client-organisations')];
    for (const retry of retries) {
      expect(retry.request.headers.get('Authorization')).toBe('Bearer new-token');
      retry.flush({ items: [] });
    }
    await expect(Promise.all([first, second])).resolves.toHaveLength(2);
  });

  it('ends the session and sends the user to sign in when the refresh is refused', async () => {
    const { http, backend, session } = setUp();
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const answer = firstValueFrom(http.get('/api/me'));
    backend.expectOne('/api/me').flush(problem401, unauthorised);
    backend.expectOne('/api/auth/refresh').flush({ ...problem401, detail: 'The sign-in session has ended.' }, unauthorised);
    await expect(answer).rejects.toMatchObject({ status: 401 });
    expect(session.signedIn()).toBe(false);
    expect(session.accessToken()).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], expect.objectContaining({ queryParams: expect.objectContaining({ expired: 1 }) }));
  });

  it('does not retry a 403: the role is missing, not the token', async () => {
    const { http, backend } = setUp();
    const answer = firstValueFrom(http.get('/api/operator/labs'));
    backend.expectOne('/api/operator/labs').flush({ type: 'about:blank', title: 'Forbidden', status: 403 }, { status: 403, statusText: 'Forbidden' });
    backend.expectNone('/api/auth/refresh');
    await expect(answer).rejects.toMatchObject({ status: 403, title: 'Forbidden' });
  });
});
