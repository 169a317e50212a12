import { TestBed } from '@angular/core/testing';
import { DistanceHistogram } from './distance-histogram';
import { LibraryMap } from './library-map';
import { VerdictChip } from './verdict-chip';

describe('verdict colours on the charts and the chip', () => {
  it('colours the sample mark on the histogram and the map with its verdict', () => {
    const histogram = TestBed.createComponent(DistanceHistogram);
    histogram.componentRef.setInput('data', { calibrationDistances: [0.01, 0.02, 0.03], t95: 0.025, t99: 0.03, sampleDistance: 0.05 });
    histogram.componentRef.setInput('verdict', 'not-consistent');
    histogram.detectChanges();
    expect((histogram.nativeElement as HTMLElement).style.getPropertyValue('--ohm-sample-mark')).toBe('var(--ohm-verdict-not-consistent-mark)');

    const map = TestBed.createComponent(LibraryMap);
    map.componentRef.setInput('points', [
      { id: 'a', label: 'LOT-A', x: 0, y: 0, kind: 'reference' },
      { id: 'b', label: 'LOT-B', x: 1, y: 1, kind: 'reference' },
      { id: 's', label: 'Sample', x: 0.4, y: 0.5, kind: 'sample' },
    ]);
    map.componentRef.setInput('verdict', 'consistent');
    map.detectChanges();
    expect((map.nativeElement as HTMLElement).style.getPropertyValue('--ohm-sample-mark')).toBe('var(--ohm-verdict-consistent-mark)');
  });

  it('leaves the sample in the theme colour where no verdict is given', () => {
    const map = TestBed.createComponent(LibraryMap);
    map.componentRef.setInput('points', [{ id: 's', label: 'Sample', x: 0, y: 0, kind: 'sample' }, { id: 'a', label: 'LOT-A', x: 1, y: 0, kind: 'reference' }]);
    map.detectChanges();
    expect((map.nativeElement as HTMLElement).style.getPropertyValue('--ohm-sample-mark')).toBe('');
  });

  it('pairs icon and word with the verdict class that picks its colour', () => {
    const chip = TestBed.createComponent(VerdictChip);
    chip.componentRef.setInput('verdict', 'inconclusive');
    chip.detectChanges();
    const el = chip.nativeElement as HTMLElement;
    expect(el.classList).toContain('inconclusive');
    expect(el.textContent).toContain('help');
    expect(el.textContent).toContain('Inconclusive');
  });
});
