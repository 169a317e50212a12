import fc from 'fast-check';
import { estimateTextWidth, placeLabels, rectInside, rectsOverlap, type LabelRect, type LabelRequest, type PlacedLabel } from './label-placement';

function expectClean(placed: readonly PlacedLabel[], bounds: LabelRect): void {
  const drawn = placed.filter((p) => p.placed);
  for (const p of drawn) expect(rectInside(p, bounds)).toBe(true);
  for (let i = 0; i < drawn.length; i++) {
    for (let j = i + 1; j < drawn.length; j++) expect(rectsOverlap(drawn[i], drawn[j])).toBe(false);
  }
}

const font = 11;
const label = (id: string, text: string, x: number, y: number, sides?: LabelRequest['sides']): LabelRequest => ({
  id,
  anchor: { x, y },
  width: estimateTextWidth(text, font),
  height: font + 3,
  sides,
});

describe('placeLabels', () => {
  it('keeps a label on its preferred side when there is room', () => {
    const bounds = { x: 0, y: 0, width: 400, height: 200 };
    const [a] = placeLabels([label('a', 'Lot A', 100, 100)], bounds);
    expect(a).toEqual(expect.objectContaining({ placed: true, side: 'right', leader: null }));
    expect(a.x).toBeGreaterThan(100);
  });

  // Reported: the T95, T99 and sample labels overlapped when the three lines stood close together.
  it('separates the T95, T99 and sample labels when their lines are a few pixels apart', () => {
    const bounds = { x: 0, y: 0, width: 640, height: 232 };
    const top = 14;
    const placed = placeLabels(
      [label('sample', 'Sample 0.071', 300, top, ['right', 'left']), label('t95', 'T95 0.066', 292, top, ['left', 'right']), label('t99', 'T99 0.071', 300, top, ['right', 'left'])],
      bounds,
    );
    expect(placed.every((p) => p.placed)).toBe(true);
    expectClean(placed, bounds);
  });

  // Reported: with the sample far out, T95 sits at the far left and its label was cut off.
  it('flips T95 to the inside when its line is at the far left edge', () => {
    const bounds = { x: 0, y: 0, width: 640, height: 232 };
    const placed = placeLabels([label('t95', 'T95 0.00412', 50, 14, ['left', 'right']), label('t99', 'T99 0.00530', 52, 14, ['right', 'left'])], bounds);
    const t95 = placed[0];
    expect(t95.placed).toBe(true);
    expect(t95.x).toBeGreaterThanOrEqual(0);
    expect(t95.side).toBe('right');
    expectClean(placed, bounds);
  });

  it('flips a label at the right edge to the left of its anchor', () => {
    const bounds = { x: 0, y: 0, width: 300, height: 100 };
    const [p] = placeLabels([label('s', 'Sample 0.31', 295, 50)], bounds);
    expect(p.side).toBe('left');
    expect(p.x + p.width).toBeLessThanOrEqual(295);
  });

  // Reported: lot labels collided on the map when lots lie close together.
  it('lays out a crowd of lot labels on the map without collisions, with leaders for moved ones', () => {
    const bounds = { x: 52, y: 16, width: 492, height: 328 };
    const crowd = Array.from({ length: 9 }, (_, i) => label(`lot${i}`, `RID-L00${10 + i} · L24-1${i}8`, 300 + (i % 3) * 4, 180 + Math.floor(i / 3) * 4));
    const placed = placeLabels(crowd, bounds, { obstacles: crowd.map((c) => ({ x: c.anchor.x - 5, y: c.anchor.y - 5, width: 10, height: 10 })) });
    expect(placed.every((p) => p.placed)).toBe(true);
    expectClean(placed, bounds);
    expect(placed.some((p) => p.leader !== null)).toBe(true);
    // A leader starts at its label's anchor and ends on the label's box.
    for (const p of placed.filter((q) => q.leader)) {
      const anchor = crowd.find((c) => c.id === p.id)!.anchor;
      expect([p.leader!.x1, p.leader!.y1]).toEqual([anchor.x, anchor.y]);
      expect(p.leader!.x2).toBeGreaterThanOrEqual(p.x - 1e-9);
      expect(p.leader!.x2).toBeLessThanOrEqual(p.x + p.width + 1e-9);
    }
  });

  it('keeps labels off the obstacles it is given (the markers) when there is room', () => {
    const bounds = { x: 0, y: 0, width: 300, height: 200 };
    const marker = { x: 100, y: 90, width: 60, height: 20 };
    const [p] = placeLabels([label('a', 'Lot A', 95, 100)], bounds, { obstacles: [marker] });
    expect(rectsOverlap(p, marker)).toBe(false);
  });

  it('reports a label it cannot fit instead of drawing it over another or outside', () => {
    const bounds = { x: 0, y: 0, width: 60, height: 16 };
    const placed = placeLabels([label('a', 'Lot A', 10, 8), label('b', 'Lot B', 12, 8), label('c', 'A very long label', 10, 8)], bounds);
    expect(placed.filter((p) => p.placed).length).toBeGreaterThanOrEqual(1);
    expect(placed.find((p) => p.id === 'c')!.placed).toBe(false);
    expectClean(placed, bounds);
  });

  it('does not draw labels with a non-finite anchor', () => {
    const [p] = placeLabels([{ id: 'x', anchor: { x: Number.NaN, y: 3 }, width: 10, height: 10 }], { x: 0, y: 0, width: 100, height: 100 });
    expect(p.placed).toBe(false);
  });

  const labelArb = fc.record({
    x: fc.double({ min: -50, max: 850, noNaN: true }),
    y: fc.double({ min: -50, max: 550, noNaN: true }),
    width: fc.double({ min: 10, max: 120, noNaN: true }),
    height: fc.double({ min: 8, max: 16, noNaN: true }),
  });

  it('never overlaps and never clips, for any labels (property)', () => {
    fc.assert(
      fc.property(
        fc.array(labelArb, { maxLength: 40 }),
        fc.record({ width: fc.double({ min: 40, max: 800, noNaN: true }), height: fc.double({ min: 20, max: 500, noNaN: true }) }),
        fc.double({ min: 0, max: 6, noNaN: true }),
        (ls, size, gap) => {
          const bounds = { x: 0, y: 0, ...size };
          const placed = placeLabels(
            ls.map((l, i) => ({ id: String(i), anchor: { x: l.x, y: l.y }, width: l.width, height: l.height })),
            bounds,
            { gap },
          );
          expect(placed).toHaveLength(ls.length);
          expectClean(placed, bounds);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('places every label when the chart has room for them (property)', () => {
    // At most 8 labels of ≤ 120 × 16 in at least 400 × 260: the positions each placed box rules out
    // ((w + w′ + gap) × (h + h′ + gap) ≤ 246 × 38 each, 7 of them) cover less than the
    // (400 − 120) × (260 − 16) region a box may take, so a free position always exists.
    fc.assert(
      fc.property(
        fc.array(labelArb, { minLength: 1, maxLength: 8 }),
        fc.record({ width: fc.double({ min: 400, max: 800, noNaN: true }), height: fc.double({ min: 260, max: 500, noNaN: true }) }),
        (ls, size) => {
          const bounds = { x: 0, y: 0, ...size };
          const placed = placeLabels(
            ls.map((l, i) => ({ id: String(i), anchor: { x: l.x, y: l.y }, width: l.width, height: l.height })),
            bounds,
          );
          expect(placed.every((p) => p.placed)).toBe(true);
          expectClean(placed, bounds);
        },
      ),
      { numRuns: 300 },
    );
  });
});
