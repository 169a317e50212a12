import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import type { ClientTeamMember, Me } from '@ohmprint/contracts';
import { Session } from '@ohmprint/ui';
import { TEST_CLIENT_PORTAL, provideTestPortal, testClientUser } from '@ohmprint/ui/testing';
import { TeamPage } from './team-page';

const colleague: ClientTeamMember = {
  id: '22222222-2222-4222-8222-222222222222',
  email: 'colleague@hollinridge.test',
  displayName: 'Colleague',
  role: 'client-member',
  createdAt: '2026-11-30T09:00:00.000Z',
};

async function open(user: Me) {
  TestBed.configureTestingModule({ providers: provideTestPortal({ portal: TEST_CLIENT_PORTAL }) });
  TestBed.inject(Session).adopt({ accessToken: 'tok', user });
  const fixture = TestBed.createComponent(TeamPage);
  fixture.detectChanges();
  const backend = TestBed.inject(HttpTestingController);
  backend.expectOne((r) => r.url === '/api/client/team').flush({ items: [colleague], total: 1, page: 1, pageSize: 20 });
  if (user.roles.includes('client-admin')) {
    backend.expectOne((r) => r.url === '/api/client/team/invitations').flush({ items: [], total: 0, page: 1, pageSize: 10 });
  } else {
    // Open invitations are the admins' business; members never ask for them.
    backend.expectNone((r) => r.url === '/api/client/team/invitations');
  }
  await fixture.whenStable();
  return { fixture, backend, loader: TestbedHarnessEnvironment.loader(fixture), root: TestbedHarnessEnvironment.documentRootLoader(fixture) };
}

describe('TeamPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('lets a member see the team but offers no invite or remove', async () => {
    const { loader, fixture } = await open(testClientUser({ roles: ['client-member'] }));
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('colleague@hollinridge.test');
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Invite a colleague/ }))).toHaveLength(0);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ selector: '[aria-label^="Remove"]' }))).toHaveLength(0);
  });

  it('removes a colleague only after the admin confirms', async () => {
    const { loader, root, backend, fixture } = await open(testClientUser({ roles: ['client-admin'] }));
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Invite a colleague/ }))).toHaveLength(1);
    await (await loader.getHarness(MatButtonHarness.with({ selector: '[aria-label="Remove Colleague from the team"]' }))).click();
    backend.expectNone((r) => r.method === 'DELETE');
    await (await root.getHarness(MatButtonHarness.with({ text: 'Remove' }))).click();
    const req = backend.expectOne('/api/client/team/22222222-2222-4222-8222-222222222222');
    expect(req.request.method).toBe('DELETE');
    req.flush(null, { status: 204, statusText: 'No Content' });
    await fixture.whenStable();
    // The list is fetched again so the removed person disappears.
    backend.expectOne((r) => r.url === '/api/client/team').flush({ items: [], total: 0, page: 1, pageSize: 20 });
  });
});
