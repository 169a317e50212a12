import { distanceHistogramLayout, histogramCounts, sturgesBinCount } from './histogram-layout';

const distances = [0.031, 0.044, 0.052, 0.038, 0.061, 0.047, 0.029, 0.055, 0.072, 0.041];

describe('histogramCounts', () => {
  it('counts as numpy.histogram does for the same edges', () => {
    const edges = [0, 0.01, 0.02, 0.03, 0.04, 0.05, 0.06, 0.07, 0.08];
    // numpy 2.4.6: np.histogram(distances, bins=edges)[0]
    expect(histogramCounts(distances, edges).map((b) => b.count)).toEqual([0, 0, 1, 2, 3, 2, 1, 1]);
  });

  it('keeps the right edge in the last bin only', () => {
    // numpy 2.4.6: np.histogram([0, .5, 1, 1, 2, 2.5, 3], bins=[0, 1, 2, 3])[0] → [2, 2, 3]
    expect(histogramCounts([0, 0.5, 1, 1, 2, 2.5, 3], [0, 1, 2, 3]).map((b) => b.count)).toEqual([2, 2, 3]);
  });
});

describe('sturgesBinCount', () => {
  it('follows Sturges (1926): ceil(log2 n) + 1', () => {
    // numpy 2.4.6: np.histogram_bin_edges(np.arange(n), bins="sturges") has n_bins = ceil(log2(n)) + 1
    expect(sturgesBinCount(10)).toBe(5);
    expect(sturgesBinCount(32)).toBe(6);
    expect(sturgesBinCount(33)).toBe(7);
  });
});

describe('distanceHistogramLayout', () => {
  it('reaches the sample even when it lies far beyond the library', () => {
    const layout = distanceHistogramLayout({ calibrationDistances: distances, t95: 0.066, t99: 0.071, sampleDistance: 0.31 }, 480, 240);
    const sample = layout.lines.find((l) => l.kind === 'sample');
    expect(sample).toBeDefined();
    expect(sample!.x).toBeLessThanOrEqual(layout.area.left + layout.area.width);
    expect(layout.bars.reduce((n, b) => n + b.count, 0)).toBe(distances.length);
  });

  it('puts T95 left of T99 and labels both', () => {
    const layout = distanceHistogramLayout({ calibrationDistances: distances, t95: 0.066, t99: 0.071, sampleDistance: null }, 480, 240);
    const [t95, t99] = layout.lines;
    expect(t95.label).toBe('T95 0.066');
    expect(t99.label).toBe('T99 0.071');
    expect(t95.x).toBeLessThan(t99.x);
    expect(layout.lines.some((l) => l.kind === 'sample')).toBe(false);
  });

  it('draws taller bars for fuller bins and shows whole-number counts only', () => {
    const layout = distanceHistogramLayout({ calibrationDistances: [0.01, 0.011, 0.012, 0.05], t95: null, t99: null, sampleDistance: null }, 480, 240);
    const full = layout.bars.find((b) => b.count === 3)!;
    const single = layout.bars.find((b) => b.count === 1)!;
    expect(full.h).toBeCloseTo(3 * single.h, 6);
    expect(layout.yTicks.every((t) => Number.isInteger(Number(t.label)))).toBe(true);
  });

  it('draws bins the API counted as given, on an axis that still reaches the sample', () => {
    const layout = distanceHistogramLayout(
      { calibrationDistances: [], t95: 0.05, t99: 0.07, sampleDistance: 0.2, bins: { binEdges: [0, 0.02, 0.04, 0.06], counts: [1, 4, 2] } },
      480,
      240,
    );
    expect(layout.bars.map((b) => [b.from, b.to, b.count])).toEqual([[0, 0.02, 1], [0.02, 0.04, 4], [0.04, 0.06, 2]]);
    expect(layout.lines.find((l) => l.kind === 'sample')!.x).toBeLessThanOrEqual(layout.area.left + layout.area.width);
  });
});

describe('distanceHistogramLayout labels', () => {
  const overlap = (a: { x: number; y: number; width: number; height: number }, b: typeof a) =>
    a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

  it('keeps the T95, T99 and sample labels apart when the three lines stand close together', () => {
    const layout = distanceHistogramLayout({ calibrationDistances: distances, t95: 0.066, t99: 0.0665, sampleDistance: 0.067 }, 640, 260);
    const boxes = layout.lines.map((l) => l.labelBox);
    expect(boxes.every((b) => b.placed)).toBe(true);
    for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) expect(overlap(boxes[i], boxes[j])).toBe(false);
  });

  it('keeps T95’s label inside the chart when a far-out sample pushes it to the left edge', () => {
    const layout = distanceHistogramLayout({ calibrationDistances: distances, t95: 0.066, t99: 0.071, sampleDistance: 4.2 }, 640, 260);
    for (const l of layout.lines) {
      expect(l.labelBox.placed).toBe(true);
      expect(l.labelBox.x).toBeGreaterThanOrEqual(0);
      expect(l.labelBox.x + l.labelBox.width).toBeLessThanOrEqual(640);
    }
    const t95 = layout.lines.find((l) => l.kind === 't95')!;
    // Its line is near the left axis, so the label flips to the line's right.
    expect(t95.labelBox.x).toBeGreaterThan(t95.x);
  });
});
