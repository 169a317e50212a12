import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { provideTestPortal, testClientUser, testUser } from '../testing/portal-testing';
import { authRoutes } from './auth.routes';

async function openSignIn(url = '/sign-in') {
  TestBed.configureTestingModule({ providers: provideTestPortal({ routes: [...authRoutes, { path: '**', children: [] }] }) });
  const harness = await RouterTestingHarness.create(url);
  const loader = TestbedHarnessEnvironment.loader(harness.fixture);
  return { harness, loader, backend: TestBed.inject(HttpTestingController) };
}

async function fill(loader: Awaited<ReturnType<typeof openSignIn>>['loader'], email: string, password: string) {
  await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName=email]' }))).setValue(email);
  await (await loader.getHarness(MatInputHarness.with({ selector: '[formControlName=password]' }))).setValue(password);
}

describe('SignInPage', () => {
  it('says what is missing instead of sending an empty form', async () => {
    const { loader, backend } = await openSignIn();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
    const fields = await loader.getAllHarnesses(MatFormFieldHarness);
    const errors = await Promise.all(fields.map((f) => f.getTextErrors()));
    expect(errors.flat()).toEqual(['Enter the e-mail address you were invited with.', 'Enter your password.']);
    backend.expectNone('/api/auth/sign-in');
  });

  it('signs in and continues to the page the user asked for', async () => {
    const { loader, backend, harness } = await openSignIn('/sign-in?returnUrl=%2Fstaff');
    await fill(loader, 'analyst@calder.test', 'ohmprint-demo-2026');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
    backend.expectOne('/api/auth/sign-in').flush({ accessToken: 'tok', user: testUser() });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/staff');
  });

  it('never follows a return address off this portal', async () => {
    const { loader, backend, harness } = await openSignIn('/sign-in?returnUrl=%2F%2Fevil.test%2F');
    await fill(loader, 'analyst@calder.test', 'ohmprint-demo-2026');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
    backend.expectOne('/api/auth/sign-in').flush({ accessToken: 'tok', user: testUser() });
    await harness.fixture.whenStable();
    expect(TestBed.inject(Router).url).toBe('/');
  });

  it('points a client user to the client portal', async () => {
    const { loader, backend, harness } = await openSignIn();
    await fill(loader, 'member@hollinridge.test', 'ohmprint-demo-2026');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
    backend.expectOne('/api/auth/sign-in').flush({ accessToken: 'tok', user: testClientUser() });
    await harness.fixture.whenStable();
    const page = harness.routeNativeElement as HTMLElement;
    expect(page.textContent).toContain('This account belongs to the client portal.');
    expect(page.textContent).toContain('a member of Hollin Ridge Cellars');
    const link = page.querySelector<HTMLAnchorElement>('a[href="/"]');
    expect(link?.textContent).toContain('Open the client portal');
    expect(TestBed.inject(Router).url).toBe('/sign-in');
  });

  it('shows the server\'s reason when sign-in is refused', async () => {
    const { loader, backend, harness } = await openSignIn();
    await fill(loader, 'analyst@calder.test', 'wrong');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
    backend
      .expectOne('/api/auth/sign-in')
      .flush({ type: 'about:blank', title: 'Unauthorized', status: 401, detail: 'The e-mail address or password is not correct.' }, { status: 401, statusText: 'Unauthorized' });
    await harness.fixture.whenStable();
    expect((harness.routeNativeElement as HTMLElement).querySelector('[role=alert]')?.textContent).toContain('The e-mail address or password is not correct.');
  });
});
