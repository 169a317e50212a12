import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { provideTestPortal, testUser } from '../testing/portal-testing';
import { authRoutes } from './auth.routes';
import { Session } from './session';

const TOKEN = 'invitation-token-0123456789abcdef';
const preview = { email: 'new.analyst@calder.test', displayName: null, labName: 'Calder Analytical', clientOrganisationName: null, roles: ['analyst'], expiresAt: '2026-12-16T09:00:00.000Z' };

async function open() {
  TestBed.configureTestingModule({ providers: provideTestPortal({ routes: [...authRoutes, { path: '**', children: [] }] }) });
  const harness = await RouterTestingHarness.create(`/accept-invitation?token=${TOKEN}`);
  const backend = TestBed.inject(HttpTestingController);
  const previewReq = backend.expectOne('/api/invitations/preview');
  expect(previewReq.request.body).toEqual({ token: TOKEN });
  return { harness, backend, previewReq, loader: TestbedHarnessEnvironment.loader(harness.fixture) };
}

async function type(loader: ReturnType<typeof TestbedHarnessEnvironment.loader>, control: string, value: string) {
  await (await loader.getHarness(MatInputHarness.with({ selector: `[formControlName=${control}]` }))).setValue(value);
}

describe('AcceptInvitationPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('explains an invitation that can no longer be used, and offers no form', async () => {
    const { harness, previewReq } = await open();
    previewReq.flush(
      { type: 'about:blank', title: 'Gone', status: 410, detail: 'This invitation expired on 1 December 2026.' },
      { status: 410, statusText: 'Gone' },
    );
    await harness.fixture.whenStable();
    const page = harness.routeNativeElement as HTMLElement;
    expect(page.textContent).toContain("This invitation can't be used.");
    expect(page.textContent).toContain('This invitation expired on 1 December 2026.');
    expect(page.querySelector('form')).toBeNull();
  });

  it('starts the name field from the name the inviter typed', async () => {
    const { harness, previewReq, loader } = await open();
    previewReq.flush({ ...preview, displayName: 'Nadia Analyst' });
    await harness.fixture.whenStable();
    const name = await loader.getHarness(MatInputHarness.with({ selector: '[formControlName=displayName]' }));
    expect(await name.getValue()).toBe('Nadia Analyst');
  });

  it('catches two different passwords before sending anything', async () => {
    const { harness, backend, previewReq, loader } = await open();
    previewReq.flush(preview);
    await harness.fixture.whenStable();
    expect((harness.routeNativeElement as HTMLElement).textContent).toContain('new.analyst@calder.test');
    await type(loader, 'displayName', 'New Analyst');
    await type(loader, 'password', 'a-long-password-1');
    await type(loader, 'confirmation', 'a-long-password-2');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Create my account' }))).click();
    const repeat = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: /Repeat the password/ }));
    expect(await repeat.getTextErrors()).toEqual(['The two passwords differ.']);
    backend.expectNone('/api/invitations/accept');
  });

  it('signs the new member in and goes home once accepted', async () => {
    const { harness, backend, previewReq, loader } = await open();
    previewReq.flush(preview);
    await harness.fixture.whenStable();
    await type(loader, 'displayName', 'New Analyst');
    await type(loader, 'password', 'a-long-password-1');
    await type(loader, 'confirmation', 'a-long-password-1');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Create my account' }))).click();
    const req = backend.expectOne('/api/invitations/accept');
    expect(req.request.body).toEqual({ token: TOKEN, displayName: 'New Analyst', password: 'a-long-password-1' });
    req.flush({ accessToken: 'fresh', user: testUser({ displayName: 'New Analyst' }) }, { status: 201, statusText: 'Created' });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Session).user()?.displayName).toBe('New Analyst');
    expect(TestBed.inject(Router).url).toBe('/');
  });
});
