import { TestBed } from '@angular/core/testing';
import { BodeChart } from './bode-chart';
import type { SpectrumSeries } from './chart-types';
import { referenceEnvelope } from './reference-envelope';

const replicate = (label: string, k: number, muted = false): SpectrumSeries => ({
  label,
  frequencyHz: [10, 100, 1000],
  re: [100 * k, 80 * k, 60 * k],
  im: [-50 * k, -60 * k, -40 * k],
  muted,
});

describe('BodeChart', () => {
  function render(series: SpectrumSeries[], withBand = false) {
    const fixture = TestBed.createComponent(BodeChart);
    fixture.componentRef.setInput('series', series);
    if (withBand) fixture.componentRef.setInput('band', referenceEnvelope(series, { kind: 'range' }, 'Library v2, full range'));
    fixture.detectChanges();
    return fixture.nativeElement as HTMLElement;
  }

  it('names the chart for screen readers with what it shows', () => {
    const el = render([replicate('Replicate 1', 1), replicate('Replicate 2', 1.02, true)]);
    const title = el.querySelector('svg > title')!;
    expect(el.querySelector('svg')!.getAttribute('aria-labelledby')).toBe(title.id);
    // numpy 2.4.6: np.abs(60−40j) = 72.111, 1.02·np.abs(100−50j) = 114.04; phases −36.87° … −26.57°
    expect(title.textContent).toBe('Bode plot of 2 spectra (1 excluded) from 10 Hz to 1 kHz; |Z| from 72.1 Ω to 114 Ω; phase from −36.9° to −26.6°.');
  });

  it('draws one line per replicate in each panel and the band when given', () => {
    const el = render([replicate('Replicate 1', 1), replicate('Replicate 2', 1.02)], true);
    expect(el.querySelectorAll('path.series')).toHaveLength(4);
    expect(el.querySelectorAll('path.band')).toHaveLength(2);
    expect(el.textContent).toContain('Library v2, full range');
  });

  it('switches to a table of the same figures and back', () => {
    const el = render([replicate('Replicate 1', 1)]);
    const toggle = el.querySelector<HTMLButtonElement>('button.toggle')!;
    expect(toggle.textContent?.trim()).toBe('Show as table');
    toggle.click();
    TestBed.tick();
    expect(el.querySelector('svg[role="img"]')).toBeNull();
    const cells = Array.from(el.querySelectorAll('tbody tr:first-child td'), (td) => td.textContent);
    // |Z| of 100 − 50j = 111.803…, phase −26.565° (numpy 2.4.6: np.abs, np.angle(deg=True))
    expect(cells).toEqual(['10 Hz', '100', '−50', '111.8', '−26.6']);
    expect(toggle.getAttribute('aria-pressed')).toBe('true');
    toggle.click();
    TestBed.tick();
    expect(el.querySelector('svg[role="img"]')).not.toBeNull();
  });
});
