import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { ActivatedRoute, convertToParamMap } from '@angular/router';
import { VerifyPage } from './verify-page';

function render(query: Record<string, string>) {
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(),
      provideHttpClientTesting(),
      { provide: ActivatedRoute, useValue: { snapshot: { queryParamMap: convertToParamMap(query) } } },
    ],
  });
  const fixture = TestBed.createComponent(VerifyPage);
  fixture.detectChanges();
  return { fixture, http: TestBed.inject(HttpTestingController), el: fixture.nativeElement as HTMLElement };
}

describe('VerifyPage', () => {
  it('checks the report named in the QR link at once and shows it as revoked with the reason', async () => {
    const { fixture, http, el } = render({ report: 'cal-2026-000123', code: 'abcd-efgh-jkmn' });
    const req = http.expectOne((r) => r.url === '/api/public/verify');
    // The typed forms are normalised before they are sent: upper case, no separators.
    expect(req.request.params.get('report')).toBe('CAL-2026-000123');
    expect(req.request.params.get('code')).toBe('ABCDEFGHJKMN');
    expect(req.request.headers.has('Authorization')).toBe(false);
    req.flush({
      outcome: 'revoked',
      message: 'Report CAL-2026-000123 was revoked by Calder Analytical.',
      report: { number: 'CAL-2026-000123', lab: 'Calder Analytical', issuedAt: '2026-11-30T10:00:00.000Z', productName: 'Ridgeline Red (demo)', sampleCode: 'OP-7K3M-Q9', verdict: 'consistent' },
      supersededBy: null,
      revocation: { reason: 'Sample mix-up at intake (demo).', revokedAt: '2026-12-01T09:00:00.000Z' },
      file: null,
    });
    await fixture.whenStable();
    expect(el.querySelector('.outcome h2')?.textContent).toBe('Revoked by the issuing lab');
    expect(el.textContent).toContain('Sample mix-up at intake (demo).');
    http.verify();
  });

  it('names the revoked report a valid one follows, after the sample was analysed again', async () => {
    const { fixture, http, el } = render({ report: 'CAL-2026-000124', code: 'ABCD-EFGH-JKMN' });
    http.expectOne((r) => r.url === '/api/public/verify').flush({
      outcome: 'valid',
      message: 'Report CAL-2026-000124 was issued by Calder Analytical and is in force.',
      report: { number: 'CAL-2026-000124', lab: 'Calder Analytical', issuedAt: '2026-12-02T10:00:00.000Z', productName: 'Ridgeline Red (demo)', sampleCode: 'OP-7K3M-Q9', verdict: 'consistent', followsRevoked: 'CAL-2026-000123' },
      supersededBy: null,
      revocation: null,
      file: null,
    });
    await fixture.whenStable();
    expect(el.querySelector('.facts')?.textContent).toContain('Followsrevoked report CAL-2026-000123 (the sample was analysed again)');
    http.verify();
  });

  it('says what is wrong with a mistyped code without asking the server', async () => {
    const { fixture, http, el } = render({});
    const inputs = el.querySelectorAll<HTMLInputElement>('input[matinput]');
    inputs[0].value = 'CAL-2026-000123';
    inputs[0].dispatchEvent(new Event('input'));
    inputs[1].value = 'ABC';
    inputs[1].dispatchEvent(new Event('input'));
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await fixture.whenStable();
    http.expectNone('/api/public/verify');
    expect(el.textContent).toContain('must be the 12-character code printed on the report');
  });
});
