import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { IntakePhoto } from '@ohmprint/contracts';
import { provideTestPortal } from '@ohmprint/ui/testing';
import { IntakePhotos } from './intake-photos';

const SAMPLE = '3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d05';
const photo = (id: string, fileName: string): IntakePhoto => ({
  id,
  fileName,
  contentType: 'image/png',
  sizeBytes: 1200,
  uploadedAt: '2026-12-02T08:00:00.000Z',
  uploadedBy: { id: '3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d04', displayName: 'Demo Intake' },
});

describe('IntakePhotos', () => {
  let http: HttpTestingController;
  let made = 0;

  beforeEach(() => {
    made = 0;
    // jsdom has no object URLs; each blob gets a distinct stand-in address.
    URL.createObjectURL = jest.fn(() => `blob:test/${++made}`);
    URL.revokeObjectURL = jest.fn();
    TestBed.configureTestingModule({ providers: provideTestPortal() });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  function render(photos: IntakePhoto[]) {
    const fixture = TestBed.createComponent(IntakePhotos);
    fixture.componentRef.setInput('sampleId', SAMPLE);
    fixture.componentRef.setInput('photos', photos);
    fixture.detectChanges();
    return fixture;
  }

  it('says there are none when intake took no photos', () => {
    const fixture = render([]);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('None');
  });

  it('fetches each photo once with the session and shows it as a thumbnail that opens full size', async () => {
    const fixture = render([photo('3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d11', 'seal.png'), photo('3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d12', 'label.png')]);
    const requests = http.match((r) => r.url.startsWith(`/api/lab/samples/${SAMPLE}/photos/`));
    expect(requests.map((r) => r.request.url)).toEqual([
      `/api/lab/samples/${SAMPLE}/photos/3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d11`,
      `/api/lab/samples/${SAMPLE}/photos/3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d12`,
    ]);
    expect(requests[0].request.responseType).toBe('blob');
    requests[0].flush(new Blob(['png'], { type: 'image/png' }));
    fixture.detectChanges();
    // The second is still on its way: it shows an empty loading slot and is not asked for again.
    http.expectNone(`/api/lab/samples/${SAMPLE}/photos/3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d12`);
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelectorAll('img')).toHaveLength(1);
    expect(el.querySelector('[aria-label="Loading photo label.png"]')).not.toBeNull();
    requests[1].flush(new Blob(['png'], { type: 'image/png' }));
    fixture.detectChanges();
    const thumbs = el.querySelectorAll<HTMLImageElement>('img');
    expect(Array.from(thumbs).map((i) => i.alt)).toEqual(['Intake photo seal.png', 'Intake photo label.png']);

    el.querySelector<HTMLButtonElement>('[aria-label="Open photo seal.png"]')!.click();
    fixture.detectChanges();
    await fixture.whenStable();
    const dialog = document.querySelector('ohm-photo-viewer-dialog') as HTMLElement;
    expect(dialog.textContent).toContain('Taken in by Demo Intake');
    expect(dialog.querySelector('img')!.getAttribute('src')).toBe(thumbs[0].getAttribute('src'));
  });

  it('releases the object URLs when the sample page goes away', () => {
    const fixture = render([photo('3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d11', 'seal.png')]);
    http.expectOne(`/api/lab/samples/${SAMPLE}/photos/3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d11`).flush(new Blob(['png']));
    fixture.destroy();
    expect(URL.revokeObjectURL).toHaveBeenCalledWith('blob:test/1');
  });
});
