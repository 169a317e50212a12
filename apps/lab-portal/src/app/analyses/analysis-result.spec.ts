import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Analysis, LotDistancePage } from '@ohmprint/contracts';
import { Session } from '@ohmprint/ui';
import { provideTestPortal, testUser } from '@ohmprint/ui/testing';
import { AnalysisResult } from './analysis-result';

const VERSION = '11111111-1111-4111-8111-111111111111';
const LOT_A = '22222222-2222-4222-8222-222222222222';
const LOT_B = '33333333-3333-4333-8333-333333333333';
const grid = [10, 100, 1000];

// Invented figures: only the wiring from the route to the plots is under test here.
const analysis: Analysis = {
  id: '44444444-4444-4444-8444-444444444444',
  sample: { id: '55555555-5555-4555-8555-555555555555', code: 'OP-TEST-01' },
  libraryVersion: { id: VERSION, version: 2, productName: 'Invented Rosé' },
  status: 'draft',
  result: {
    verdict: 'consistent',
    nearest: { lotId: LOT_A, lotCode: 'LOT-A', distance: 0.01 },
    t95: 0.02,
    t99: 0.03,
    typicality: 0.5,
    distances: [{ lotId: LOT_A, lotCode: 'LOT-A', distance: 0.01 }, { lotId: LOT_B, lotCode: 'LOT-B', distance: 0.015 }],
    map: { sample: [0, 0], lots: [] },
    histogram: { binEdges: [0, 0.05], counts: [2] },
    fit: null,
    qualityFlags: [],
    replicateIds: [],
  },
  method: {
    bandMinHz: 10, bandMaxHz: 1000, gridPoints: 8, referenceTemperatureC: 20, temperatureCoefficientPerC: 0.02,
    lowerQuantile: 0.95, upperQuantile: 0.99, minimumLots: 5, minimumReplicates: 3, model: 'cole-cole',
    kkResidualLimitPercent: 2, replicateDistanceLimit: 0.05, temperatureMismatchLimitC: 0.5,
  },
  sampleSpectrum: { frequencyHz: grid, re: [105, 102, 101], im: [-20, -10, -2] },
  engineVersion: '1.0.0',
  remarks: '',
  analyst: { id: '66666666-6666-4666-8666-666666666666', displayName: 'Invented Analyst' },
  createdAt: '2026-12-01T09:00:00.000Z',
  submittedAt: null,
  reviews: [],
};

// The version's band as the API stores it at publication (range of two invented lots).
const withBand: Analysis = {
  ...analysis,
  referenceBand: {
    frequencyHz: grid, lotCount: 2,
    reLow: [100, 98, 97], reHigh: [110, 104, 103], imLow: [-22, -11, -3], imHigh: [-18, -9, -1],
    modulusLow: [102.4, 98.6, 97.0], modulusHigh: [111.5, 104.4, 103.0], phaseLowDeg: [-12.4, -6.4, -1.8], phaseHighDeg: [-9.3, -4.9, -0.6],
  },
};

const lotId = (i: number) => `77777777-7777-4777-8777-${String(i).padStart(12, '0')}`;
/** A 3,000-lot library: the analysis holds its nearest lots only. */
const large: Analysis = {
  ...withBand,
  result: {
    ...analysis.result,
    lotCount: 3000,
    distances: Array.from({ length: 59 }, (_, i) => ({ lotId: lotId(i), lotCode: `BIG-${i}`, distance: 0.01 + i / 1000 })),
  },
};

describe('AnalysisResult', () => {
  function render(a: Analysis) {
    TestBed.configureTestingModule({ providers: provideTestPortal() });
    TestBed.inject(Session).adopt({ accessToken: 'tok', user: testUser({ roles: ['analyst'] }) });
    const fixture = TestBed.createComponent(AnalysisResult);
    fixture.componentRef.setInput('analysis', a);
    fixture.detectChanges();
    return fixture;
  }

  it('draws the sample alone when the analysis carries no band', () => {
    const el: HTMLElement = render(analysis).nativeElement;
    expect(el.querySelectorAll('ohm-bode-chart path.band')).toHaveLength(0);
  });

  it('shades the stored reference band behind the sample without downloading the lots', () => {
    const fixture = render(withBand);
    const el: HTMLElement = fixture.nativeElement;
    TestBed.inject(HttpTestingController).verify();

    expect(el.querySelectorAll('ohm-bode-chart path.band')).toHaveLength(2);
    expect(el.querySelectorAll('ohm-nyquist-chart path.band')).toHaveLength(1);
    expect(el.querySelector('ohm-bode-chart')?.textContent).toContain('Reference lots (range)');
    expect(el.querySelector('ohm-nyquist-chart')?.textContent).toContain('Sample OP-TEST-01 (replicate mean)');
  });

  it('lists the ten nearest lots and pages through the rest only when asked', async () => {
    const fixture = render(large);
    const el: HTMLElement = fixture.nativeElement;
    const http = TestBed.inject(HttpTestingController);
    http.verify();
    const nearestTable = el.querySelector('section[aria-labelledby="distances-heading"] table');
    expect(nearestTable?.querySelectorAll('tbody tr')).toHaveLength(10);
    expect(nearestTable?.textContent).toContain('The 10 nearest of 3,000 lots');

    const show = Array.from(el.querySelectorAll('button')).find((b) => b.textContent?.includes('Show every lot'));
    show?.click();
    const page: LotDistancePage = { items: Array.from({ length: 50 }, (_, i) => ({ lotId: lotId(i), lotCode: `BIG-${i}`, distance: 0.01 + i / 1000, rank: i + 1 })), total: 3000, next: 50 };
    http.expectOne((r) => r.url === `/api/lab/analyses/${large.id}/lot-distances` && r.params.get('after') === '0' && r.params.get('limit') === '50').flush(page);
    await fixture.whenStable();
    fixture.detectChanges();
    expect(el.querySelector('ohm-lot-distance-pager tbody')?.querySelectorAll('tr')).toHaveLength(50);
    expect(el.querySelector('ohm-lot-distance-pager caption')?.textContent).toContain('Lots 1–50 of 3,000');

    Array.from(el.querySelectorAll('ohm-lot-distance-pager button')).find((b) => b.textContent?.includes('Next'))?.dispatchEvent(new Event('click'));
    http.expectOne((r) => r.url === `/api/lab/analyses/${large.id}/lot-distances` && r.params.get('after') === '50');
  });
});

describe('AnalysisResult with a fit and producer lot codes', () => {
  function render(a: Analysis): HTMLElement {
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: provideTestPortal() });
    TestBed.inject(Session).adopt({ accessToken: 'tok', user: testUser({ roles: ['analyst'] }) });
    const fixture = TestBed.createComponent(AnalysisResult);
    fixture.componentRef.setInput('analysis', a);
    fixture.detectChanges();
    return fixture.nativeElement;
  }
  const fitted: Analysis = {
    ...analysis,
    result: {
      ...analysis.result,
      typicality: 0.17,
      map: { sample: [0, 0], lots: [{ lotId: LOT_A, lotCode: 'LOT-A', x: 1, y: 0 }, { lotId: LOT_B, lotCode: 'LOT-B', x: -1, y: 0.2 }], axisShares: [0.62, 0.21] },
      fit: {
        model: 'cole-cole', chiSquare: 0.0012, converged: true, weighting: 'modulus',
        parameters: [{ name: 'rInf', value: 90, standardError: 1, unit: 'Ω·cm' }],
        curve: { re: [104, 102.5, 100.5], im: [-20.5, -9.5, -2.1] },
      },
    },
    producerLotCodes: { [LOT_A]: 'L24-118' },
    claimedLot: { lotCode: 'L24-118', nearestIsClaimed: true },
  };

  it('draws the fitted curve over the data with its residuals, and states the weighting beside χ²', () => {
    const el = render(fitted);
    expect(el.querySelectorAll('ohm-bode-chart path.series')).toHaveLength(4); // sample and fit, in |Z| and phase
    expect(el.querySelector('ohm-nyquist-chart')?.textContent).toContain('Fitted Cole–Cole relaxation model');
    expect(el.querySelectorAll('ohm-fit-residual-chart path.residual')).toHaveLength(2);
    expect(el.querySelector('[data-testid="fit-summary"]')?.textContent).toMatch(/χ²\s+0\.0012\s*\(modulus weighting\)/);
  });

  it('writes fitted values in the report’s number format: symbol with its subscript, value and SE to the same place', () => {
    const el = render(fitted);
    const row = el.querySelector('[aria-labelledby="fit-heading"] tbody tr')!;
    // an SE of 1 has leading digits 100, so it keeps two digits (the 354/949 rule, libs/contracts/src/format)
    expect(row.querySelector('ohm-symbol sub')?.textContent).toBe('∞');
    expect(row.querySelector('ohm-quantity')?.textContent?.trim()).toBe('90.0 ± 1.0');
  });

  it('explains typicality, gives the map axes their share of spread, and keeps the engine version in the details', () => {
    const el = render(fitted);
    expect(el.querySelector('[data-testid="typicality-text"]')?.textContent).toContain("17 % of the library's calibration distances are larger than the sample's");
    expect(el.querySelector('ohm-library-map')?.textContent).toContain('Map axis 1 (62 % of spread)');
    expect(el.querySelector('ohm-library-map')?.textContent).toContain('Map axis 2 (21 % of spread)');
    expect(el.querySelector('.headline')?.textContent).not.toContain('1.0.0');
    expect(el.querySelector('[data-testid="engine-version"]')?.textContent).toBe('1.0.0');
  });

  it('shows the producer’s code of the nearest lot and whether it is the claimed lot', () => {
    const el = render(fitted);
    expect(el.querySelector('[data-testid="nearest-lot"]')?.textContent).toMatch(/LOT-A\s+producer's lot L24-118/);
    expect(el.querySelector('[data-testid="claimed-lot"]')?.textContent).toContain('the nearest lot LOT-A is that lot');
    const other = render({ ...fitted, claimedLot: { lotCode: 'L24-131', nearestIsClaimed: false } });
    expect(other.querySelector('[data-testid="claimed-lot"]')?.textContent).toContain('is not that lot');
  });

  it('says nothing of a claimed lot when none was claimed, and draws no fit on an older analysis', () => {
    const el = render(analysis);
    expect(el.querySelector('[data-testid="claimed-lot"]')).toBeNull();
    expect(el.querySelector('ohm-fit-residual-chart')).toBeNull();
    expect(el.querySelector('ohm-library-map')?.textContent).toContain('Map axis 1');
  });
});
