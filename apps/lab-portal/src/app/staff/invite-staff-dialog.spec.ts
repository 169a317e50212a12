import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { provideTestPortal } from '@ohmprint/ui/testing';
import { InviteStaffDialog } from './invite-staff-dialog';

async function open() {
  const close = jest.fn();
  TestBed.configureTestingModule({ providers: [...provideTestPortal(), { provide: MatDialogRef, useValue: { close } }] });
  const fixture = TestBed.createComponent(InviteStaffDialog);
  fixture.detectChanges();
  return { fixture, close, backend: TestBed.inject(HttpTestingController), loader: TestbedHarnessEnvironment.loader(fixture) };
}

describe('InviteStaffDialog', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('asks for at least one role before sending anything', async () => {
    const { fixture, backend, loader } = await open();
    await (await loader.getHarness(MatInputHarness)).setValue('new.analyst@calder.test');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Send invitation' }))).click();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Pick at least one role.');
    backend.expectNone('/api/lab/staff/invitations');
  });

  it('sends the e-mail and the ticked roles, then closes with the invitation', async () => {
    const { fixture, close, backend, loader } = await open();
    await (await loader.getHarness(MatInputHarness)).setValue('new.analyst@calder.test');
    await (await loader.getHarness(MatCheckboxHarness.with({ label: /Reviewer/ }))).check();
    await (await loader.getHarness(MatCheckboxHarness.with({ label: /Analyst/ }))).check();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Send invitation' }))).click();
    const req = backend.expectOne('/api/lab/staff/invitations');
    // Roles go in the catalogue's order, whatever order they were ticked in.
    expect(req.request.body).toEqual({ email: 'new.analyst@calder.test', roles: ['analyst', 'reviewer'] });
    const invitation = {
      id: '11111111-1111-4111-8111-111111111111',
      email: 'new.analyst@calder.test',
      roles: ['analyst', 'reviewer'],
      status: 'pending',
      expiresAt: '2026-12-16T09:00:00.000Z',
      createdAt: '2026-12-02T09:00:00.000Z',
    };
    req.flush(invitation, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(close).toHaveBeenCalledWith(invitation);
  });

  it('shows the server\'s objection beside the e-mail field and stays open', async () => {
    const { fixture, close, backend, loader } = await open();
    await (await loader.getHarness(MatInputHarness)).setValue('analyst@calder.test');
    await (await loader.getHarness(MatCheckboxHarness.with({ label: /Analyst/ }))).check();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Send invitation' }))).click();
    backend.expectOne('/api/lab/staff/invitations').flush(
      { type: 'about:blank', title: 'Conflict', status: 409, detail: 'analyst@calder.test already works in this lab.', errors: [{ field: 'email', message: 'already works in this lab' }] },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: /E-mail/ }));
    expect(await field.getTextErrors()).toEqual(['E-mail already works in this lab.']);
    expect((fixture.nativeElement as HTMLElement).querySelector('[role=alert]')?.textContent).toContain('analyst@calder.test already works in this lab.');
    expect(close).not.toHaveBeenCalled();
  });
});
