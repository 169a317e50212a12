import { libraryMapLayout, type MapPoint } from './library-map-layout';

// The corners of a 3 × 4 rectangle: classical MDS gives (±2, ±1.5) (REFERENCES.md, exact case).
const points: MapPoint[] = [
  { id: 'sample', label: 'Sample', x: 2.4, y: 1.2, kind: 'sample' },
  { id: 'a', label: 'Lot A', x: 2, y: 1.5, kind: 'reference' },
  { id: 'b', label: 'Lot B', x: -2, y: 1.5, kind: 'reference' },
  { id: 'c', label: 'Lot C', x: -2, y: -1.5, kind: 'reference' },
  { id: 'd', label: 'Lot D', x: 2, y: -1.5, kind: 'reference' },
];

describe('libraryMapLayout', () => {
  const layout = libraryMapLayout(points, 'a', 480, 360);

  it('keeps distances: the rectangle stays 4 by 3 on screen', () => {
    const at = (id: string) => layout.points.find((p) => p.id === id)!;
    const width = at('a').px - at('b').px;
    const height = at('d').py - at('a').py;
    expect(width / height).toBeCloseTo(4 / 3, 6);
  });

  it('draws the sample last so no lot hides it, and links it to the nearest lot', () => {
    expect(layout.points[layout.points.length - 1].kind).toBe('sample');
    expect(layout.points.filter((p) => p.nearest).map((p) => p.label)).toEqual(['Lot A']);
    const a = layout.points.find((p) => p.id === 'a')!;
    expect(layout.link).toEqual(expect.objectContaining({ x2: a.px, y2: a.py }));
  });

  it('has no link when no nearest lot is known', () => {
    expect(libraryMapLayout(points, null, 480, 360).link).toBeNull();
  });
});

describe('libraryMapLayout labels', () => {
  it('names the sample, the nearest lot and nearby lots without two labels colliding, even when lots crowd together', () => {
    const crowd: MapPoint[] = [
      { id: 'sample', label: 'OP-2026-0042', x: 0.001, y: 0.0005, kind: 'sample' },
      ...Array.from({ length: 14 }, (_, i): MapPoint => ({ id: `l${i}`, label: `RID-L00${10 + i}`, x: (i % 4) * 0.002, y: Math.floor(i / 4) * 0.001, kind: 'reference' })),
      { id: 'far', label: 'RID-L0099', x: 0.4, y: 0.3, kind: 'reference' },
    ];
    const layout = libraryMapLayout(crowd, 'l1', 560, 380);
    const shown = layout.labels.filter((l) => l.placed);
    expect(shown.map((l) => l.kind).slice(0, 2)).toEqual(['sample', 'nearest']);
    expect(shown.length).toBeGreaterThanOrEqual(5);
    for (let i = 0; i < shown.length; i++) {
      const a = shown[i];
      expect(a.x).toBeGreaterThanOrEqual(layout.area.left);
      expect(a.x + a.width).toBeLessThanOrEqual(layout.area.left + layout.area.width + 1e-9);
      for (let j = i + 1; j < shown.length; j++) {
        const b = shown[j];
        expect(a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height).toBe(false);
      }
    }
  });
});
