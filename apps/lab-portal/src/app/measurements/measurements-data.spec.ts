import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MeasurementsData, type UploadProgress } from './measurements-data';

const replicate = {
  id: '3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d01',
  replicateNumber: 1,
  fileName: 'rep1.csv',
  instrument: { id: '3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d02', name: 'Bench analyser A' },
  cell: { id: '3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d03', name: 'Cell 1' },
  cellConstantPerCm: 1.002,
  cellConstantSource: 'latest-calibration',
  calibrationId: null,
  temperatureC: 20,
  temperatureSource: 'entered',
  declared: null,
  pointCount: 61,
  minFrequencyHz: 0.1,
  maxFrequencyHz: 1e5,
  kramersKronig: { passed: true, maxResidualPercent: 0.4, elements: 18, mu: 0.74, limitPercent: 1 },
  excluded: false,
  exclusionReason: null,
  via: 'portal',
  uploadedBy: { id: '3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d04', displayName: 'Demo Analyst' },
  uploadedAt: '2026-12-02T08:00:00.000Z',
};

describe('MeasurementsData', () => {
  let data: MeasurementsData;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    data = TestBed.inject(MeasurementsData);
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('sends one file with the bench fields and reports progress, then the parsed answer', () => {
    const seen: UploadProgress[] = [];
    const file = new File(['f,re,im\n1,2,3\n'], 'rep1.csv', { type: 'text/csv' });
    data
      .upload('3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d05', { instrumentId: replicate.instrument.id, cellId: replicate.cell.id, cellConstantSource: 'entered', cellConstantPerCm: 1.2, temperatureC: 20 }, file)
      .subscribe((p) => seen.push(p));
    const req = http.expectOne('/api/lab/samples/3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d05/measurements');
    const body = req.request.body as FormData;
    expect(body.get('cellConstantPerCm')).toBe('1.2');
    expect(body.get('cellConstantSource')).toBe('entered');
    expect((body.get('files') as File).name).toBe('rep1.csv');
    expect(req.request.reportProgress).toBe(true);
    req.event({ type: 1, loaded: 50, total: 200 });
    req.flush({ saved: [replicate], rejected: [] });
    expect(seen[0]).toEqual({ kind: 'progress', percent: 25 });
    expect(seen[1]).toEqual({ kind: 'done', result: { saved: [expect.objectContaining({ fileName: 'rep1.csv' })], rejected: [] } });
  });

  it('leaves the cell constant out when it comes from the latest KCl calibration', () => {
    const file = new File(['x'], 'rep2.csv');
    data
      .upload('3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d05', { instrumentId: replicate.instrument.id, cellId: replicate.cell.id, cellConstantSource: 'latest-calibration', temperatureC: 21.5 }, file)
      .subscribe();
    const req = http.expectOne('/api/lab/samples/3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d05/measurements');
    expect((req.request.body as FormData).has('cellConstantPerCm')).toBe(false);
    expect((req.request.body as FormData).get('temperatureC')).toBe('21.5');
    req.flush({ saved: [], rejected: [{ fileName: 'rep2.csv', line: 4, column: 2, message: 'expected a number' }] });
  });

  it('refuses an answer that does not match the contract instead of showing wrong figures', () => {
    let failure: unknown;
    data.forSample('3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d05').subscribe({ error: (e: unknown) => (failure = e) });
    http.expectOne('/api/lab/samples/3f2a6c1e-0b1d-4c1a-9a43-1f9e2b7c5d05/measurements').flush({ sampleId: 'nope', replicates: [] });
    expect(failure).toBeDefined();
  });
});
