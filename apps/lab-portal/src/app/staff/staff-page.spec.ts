import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatSortHeaderHarness } from '@angular/material/sort/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import type { Page, StaffMember } from '@ohmprint/contracts';
import { Session } from '@ohmprint/ui';
import { provideTestPortal, testUser } from '@ohmprint/ui/testing';
import { StaffPage } from './staff-page';

const admin = testUser({ email: 'admin@calder.test', displayName: 'Alex Admin', roles: ['lab-admin'] });

function member(n: number, overrides: Partial<StaffMember> = {}): StaffMember {
  return {
    id: `00000000-0000-4000-8000-00000000000${n}`,
    email: `person${n}@calder.test`,
    displayName: `Person ${n}`,
    roles: ['analyst'],
    status: 'active',
    createdAt: '2026-11-30T09:00:00.000Z',
    ...overrides,
  };
}

function page(items: StaffMember[], total = items.length): Page<StaffMember> {
  return { items, total, page: 1, pageSize: 20 };
}

async function open() {
  TestBed.configureTestingModule({ providers: provideTestPortal() });
  TestBed.inject(Session).adopt({ accessToken: 'tok', user: admin });
  const fixture = TestBed.createComponent(StaffPage);
  fixture.detectChanges();
  const backend = TestBed.inject(HttpTestingController);
  return { fixture, backend, loader: TestbedHarnessEnvironment.loader(fixture) };
}

function expectList(backend: HttpTestingController): TestRequest {
  return backend.expectOne((req) => req.url === '/api/lab/staff');
}

const openInvitation = {
  id: '33333333-3333-4333-8333-333333333333',
  email: 'joining.soon@calder.test',
  roles: ['intake-technician'],
  status: 'pending',
  expiresAt: '2099-01-01T00:00:00.000Z',
  createdAt: '2026-12-01T09:00:00.000Z',
};

function flushPending(backend: HttpTestingController, items: unknown[] = []): void {
  backend.expectOne((req) => req.url === '/api/lab/staff/invitations').flush({ items, total: items.length, page: 1, pageSize: 10 });
}

describe('StaffPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('asks the API for the first page sorted by name and shows each person with their roles', async () => {
    const { fixture, backend, loader } = await open();
    const req = expectList(backend);
    expect(req.request.params.toString()).toBe('sort=displayName&dir=asc&page=1&pageSize=20');
    req.flush(page([member(1, { roles: ['analyst', 'reviewer'] }), member(2, { status: 'deactivated' })]));
    flushPending(backend);
    await fixture.whenStable();
    const table = await loader.getHarness(MatTableHarness);
    const rows = await table.getCellTextByColumnName();
    expect(rows['email'].text).toEqual(['person1@calder.test', 'person2@calder.test']);
    expect(rows['roles'].text[0]).toContain('Analyst');
    expect(rows['roles'].text[0]).toContain('Reviewer');
    // Icon ligature names precede the words in the cell text; the words are what people read.
    expect(rows['status'].text[0]).toMatch(/Active$/);
    expect(rows['status'].text[1]).toMatch(/Deactivated$/);
  });

  it('fetches again from the server when a column is sorted, back on the first page', async () => {
    const { fixture, backend, loader } = await open();
    expectList(backend).flush(page([member(1)], 45));
    flushPending(backend);
    await fixture.whenStable();
    const emailHeader = await loader.getHarness(MatSortHeaderHarness.with({ label: 'E-mail' }));
    await emailHeader.click();
    const req = expectList(backend);
    expect(req.request.params.get('sort')).toBe('email');
    expect(req.request.params.get('dir')).toBe('asc');
    expect(req.request.params.get('page')).toBe('1');
    req.flush(page([member(1)], 45));
  });

  it('says what to do next when the lab has no staff to list', async () => {
    const { fixture, backend } = await open();
    expectList(backend).flush(page([]));
    flushPending(backend);
    await fixture.whenStable();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('No staff yet');
    expect(text).toContain('Invite your intake technicians, analysts and reviewers.');
  });

  it('says the list could not be loaded when the API fails', async () => {
    const { fixture, backend } = await open();
    expectList(backend).flush({ type: 'about:blank', title: 'Server error', status: 500 }, { status: 500, statusText: 'Server Error' });
    flushPending(backend);
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('The staff list could not be loaded');
  });

  it('shows people invited but not joined yet, apart from the staff list', async () => {
    const { fixture, backend } = await open();
    expectList(backend).flush(page([member(1)]));
    flushPending(backend, [openInvitation]);
    await fixture.whenStable();
    const section = (fixture.nativeElement as HTMLElement).querySelector('ohm-pending-invitations');
    expect(section?.textContent).toContain('Waiting to join (1)');
    expect(section?.textContent).toContain('joining.soon@calder.test');
    expect(section?.textContent).toContain('Intake technician');
  });
});
