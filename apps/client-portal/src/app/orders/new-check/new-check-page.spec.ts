import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { ProductSummary } from '@ohmprint/contracts';
import { Session } from '@ohmprint/ui';
import { ORG_ID, TEST_CLIENT_PORTAL, provideTestPortal, testClientUser } from '@ohmprint/ui/testing';
import { NewCheckPage } from './new-check-page';

const product = (id: string, name: string, published: boolean): ProductSummary => ({
  id,
  name,
  matrix: 'wine',
  description: '',
  clientOrganisation: { id: ORG_ID, name: 'Hollin Ridge Cellars' },
  publishedLibraryVersion: published ? { id: '9a9a9a9a-1111-4111-8111-111111111111', version: 2, lotCount: 12 } : null,
  libraryState: published ? 'published' : 'none',
  hasPhoto: false,
});
const RED = '11111111-1111-4111-8111-111111111111';
const ROSE = '22222222-2222-4222-8222-222222222222';

async function open() {
  TestBed.configureTestingModule({ providers: provideTestPortal({ portal: TEST_CLIENT_PORTAL }) });
  TestBed.inject(Session).adopt({ accessToken: 'tok', user: testClientUser({ roles: ['client-admin'] }) });
  const fixture = TestBed.createComponent(NewCheckPage);
  fixture.detectChanges();
  const backend = TestBed.inject(HttpTestingController);
  backend.expectOne((r) => r.url === '/api/client/products').flush({ items: [product(RED, 'Ridgeline Red', true), product(ROSE, 'Unlibraried Rosé', false)], total: 2, page: 1, pageSize: 100 });
  backend.expectOne('/api/client/order-prices').flush({ creditsPerCheckSample: 1, creditsPerReferenceLot: 1, available: 1, reserved: 0 });
  await fixture.whenStable();
  return { fixture, backend, el: fixture.nativeElement as HTMLElement };
}

function type(el: HTMLElement, label: string, value: string): void {
  const field = [...el.querySelectorAll('mat-form-field')].find((f) => f.querySelector('mat-label')?.textContent?.trim() === label);
  const input = field?.querySelector('input, textarea') as HTMLInputElement;
  input.value = value;
  input.dispatchEvent(new Event('input'));
}

describe('NewCheckPage', () => {
  beforeEach(() => sessionStorage.clear());
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('offers only products with a published library and sends the others to enrolment', async () => {
    const { el } = await open();
    const choices = [...el.querySelectorAll('mat-radio-button')].map((r) => r.textContent);
    expect(choices).toHaveLength(1);
    expect(choices[0]).toContain('Ridgeline Red');
    expect(el.querySelector('.not-ready')?.textContent).toContain('Unlibraried Rosé — no reference library yet');
    expect(el.querySelector('.not-ready a')?.getAttribute('href')).toBe(`/products/${ROSE}/enrol`);
  });

  it('says how many credits are missing, links to buying a pack, and keeps every field typed (also across a reload)', async () => {
    const { fixture, backend, el } = await open();
    const page = fixture.componentInstance as unknown as { product: { setValue(v: string): void }; addSample(): void; place(): void };
    page.product.setValue(RED);
    page.addSample();
    fixture.detectChanges();
    const fields = [...el.querySelectorAll('.sample')];
    expect(fields).toHaveLength(2);
    for (const [i, sample] of fields.entries()) {
      type(sample as HTMLElement, 'Where it was obtained', `Market stall ${i + 1}`);
      type(sample as HTMLElement, 'When it was obtained', '2026-11-20');
      type(sample as HTMLElement, 'Lot claimed on the label', `L24-14${i}`);
    }
    page.place();
    const req = backend.expectOne('/api/client/orders');
    expect(req.request.body).toEqual({
      productId: RED,
      samples: [0, 1].map((i) => ({ obtainedWhere: `Market stall ${i + 1}`, obtainedOn: '2026-11-20', labelText: '', lotClaimed: `L24-14${i}`, container: '', notes: '' })),
    });
    req.flush(
      { type: 'urn:ohmprint:problem:insufficient-credits', title: 'Not enough credits', status: 409, detail: 'This order needs 2 credits; 1 is available, so 1 is missing.', needed: 2, available: 1, shortfall: 1 },
      { status: 409, statusText: 'Conflict', headers: { 'content-type': 'application/problem+json' } },
    );
    backend.expectOne('/api/client/order-prices').flush({ creditsPerCheckSample: 1, creditsPerReferenceLot: 1, available: 1, reserved: 0 });
    await fixture.whenStable();
    fixture.detectChanges();

    expect(el.textContent).toContain('1 more credit is needed.');
    expect(el.querySelector('a[href="/credits"]')?.textContent).toContain('Buy credits');
    const kept = [...el.querySelectorAll('.sample input')].map((i) => (i as HTMLInputElement).value);
    expect(kept).toContain('Market stall 1');
    expect(kept).toContain('Market stall 2');

    // Leaving for the credits page and coming back restores the draft.
    fixture.destroy();
    const again = TestBed.createComponent(NewCheckPage);
    again.detectChanges();
    backend.expectOne((r) => r.url === '/api/client/products').flush({ items: [product(RED, 'Ridgeline Red', true)], total: 1, page: 1, pageSize: 100 });
    backend.expectOne('/api/client/order-prices').flush({ creditsPerCheckSample: 1, creditsPerReferenceLot: 1, available: 5, reserved: 0 });
    await again.whenStable();
    again.detectChanges();
    const restored = [...(again.nativeElement as HTMLElement).querySelectorAll('.sample input')].map((i) => (i as HTMLInputElement).value);
    expect(restored).toEqual(expect.arrayContaining(['Market stall 1', 'L24-140', 'Market stall 2', 'L24-141']));
  });
});
