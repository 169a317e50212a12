import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatInputHarness } from '@angular/material/input/testing';
import type { ReportSummary } from '@ohmprint/contracts';
import { provideTestPortal } from '@ohmprint/ui/testing';
import { ReasonDialog } from './reason-dialog';

const REPORT_ID = '33333333-3333-4333-8333-333333333333';
const summary = {
  id: REPORT_ID,
  number: 'CAL-2026-000042',
  revision: 0,
  status: 'issued',
  verdict: 'consistent',
  sampleCode: 'OP-7K3M-Q9',
  productName: 'Ridgeline Red (demo)',
  clientOrganisation: { id: '44444444-4444-4444-8444-444444444444', name: 'Hollin Ridge Cellars' },
  analysisId: '55555555-5555-4555-8555-555555555555',
  issuedAt: '2026-12-01T09:00:00.000Z',
  sha256: 'ab'.repeat(32),
  pdfSize: 120_000,
  replacesNumber: null,
  supersededByNumber: null,
  amendmentReason: null,
  revokedAt: null,
  revocationReason: null,
} satisfies ReportSummary;
const detail = { ...summary, verificationCode: 'K7QM-4RTX-9WHP', verificationUrl: 'http://x/verify', issuedBy: 'Rae Viewer', revokedBy: null, remarks: 'Claimed lot L24-118 read from the capsule.' };

function open(action: 'amend' | 'revoke') {
  const close = jest.fn();
  TestBed.configureTestingModule({
    providers: [...provideTestPortal(), { provide: MatDialogRef, useValue: { close } }, { provide: MAT_DIALOG_DATA, useValue: { report: summary, action } }],
  });
  const fixture = TestBed.createComponent(ReasonDialog);
  fixture.detectChanges();
  return { fixture, close, backend: TestBed.inject(HttpTestingController), loader: TestbedHarnessEnvironment.loader(fixture) };
}

describe('ReasonDialog', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('starts an amendment from the report’s current remarks and sends them as edited', async () => {
    const { fixture, backend, loader } = open('amend');
    const confirm = await loader.getHarness(MatButtonHarness.with({ text: 'Issue amendment' }));
    backend.expectOne(`/api/lab/reports/${REPORT_ID}`).flush(detail);
    await fixture.whenStable();
    const [remarks, reason] = await loader.getAllHarnesses(MatInputHarness);
    expect(await remarks.getValue()).toBe('Claimed lot L24-118 read from the capsule.');
    await remarks.setValue('Claimed lot L24-119 read from the capsule.');
    await reason.setValue('Lot misread at intake.');
    await confirm.click();
    const req = backend.expectOne(`/api/lab/reports/${REPORT_ID}/amend`);
    expect(req.request.body).toEqual({ reason: 'Lot misread at intake.', corrections: { remarks: 'Claimed lot L24-119 read from the capsule.' } });
    req.flush({ ...detail, id: '66666666-6666-4666-8666-666666666666', number: 'CAL-2026-000042-R1', revision: 1 });
  });

  it('cannot send an amendment before the current remarks have loaded (no blank remarks by mistake)', async () => {
    const { fixture, backend, loader } = open('amend');
    const [, reason] = await loader.getAllHarnesses(MatInputHarness);
    await reason.setValue('Lot misread at intake.');
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: 'Issue amendment' }))).isDisabled()).toBe(true);
    backend.expectOne(`/api/lab/reports/${REPORT_ID}`).flush(detail);
    await fixture.whenStable();
    expect(await (await loader.getHarness(MatButtonHarness.with({ text: 'Issue amendment' }))).isDisabled()).toBe(false);
  });

  it('asks nothing of the remarks when revoking', async () => {
    const { loader, backend } = open('revoke');
    expect(await loader.getAllHarnesses(MatInputHarness)).toHaveLength(1);
    backend.expectNone(`/api/lab/reports/${REPORT_ID}`);
  });
});
