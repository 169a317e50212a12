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
