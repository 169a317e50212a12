import PDFDocument from 'pdfkit';
import { rectInside, rectsOverlap, type PlacedLabel } from '@ohmprint/contracts';
import { registerInter } from './inter-fonts';
import { placeLineLabels, placeMapLabels, MAP_LABELLED_LOTS } from './library-plots';
import { linearAxis } from './plot-frame';

const doc = new PDFDocument({ size: 'A4' });
registerInter(doc);
const box = { x: 100, y: 400, w: 200, h: 170 };
const frame = { x: box.x, y: box.y, width: box.w, height: box.h };

function expectClear(placed: PlacedLabel[]) {
  const drawn = placed.filter((p) => p.placed);
  for (const p of drawn) expect(rectInside(p, frame)).toBe(true);
  drawn.forEach((a, i) => drawn.slice(i + 1).forEach((b) => expect(rectsOverlap(a, b)).toBe(false)));
}

describe('labels of the report histogram', () => {
  it('keeps T95, T99 and the sample apart and inside the frame when the thresholds sit at the left edge and the sample far right', () => {
    const placed = placeLineLabels(doc, box, [
      { at: box.x + box.w - 1, text: 'sample' },
      { at: box.x + 1.5, text: 'T95' },
      { at: box.x + 3, text: 'T99' },
    ]);
    expect(placed.every((p) => p.placed)).toBe(true);
    expectClear(placed);
  });

  it('keeps three labels on one spot apart', () => {
    const placed = placeLineLabels(doc, box, ['sample', 'T95', 'T99'].map((text) => ({ at: box.x + 100, text })));
    expect(placed.every((p) => p.placed)).toBe(true);
    expectClear(placed);
  });
});

describe('labels of the report map', () => {
  it('names the sample and at most the lots nearest it in a crowded library, none overlapping or past the frame', () => {
    const lots = Array.from({ length: 80 }, (_, i) => ({ label: `RID-L${String(i + 1).padStart(4, '0')}`, x: Math.cos(i * 2.4) * (0.002 + (i % 7) * 0.001), y: Math.sin(i * 2.4) * (0.002 + (i % 5) * 0.001) }));
    const plots = { map: { lots, sample: { x: 0.012, y: 0.0001 } } } as Parameters<typeof placeMapLabels>[2];
    const x = linearAxis(-0.01, 0.015, 'map axis 1', String, 4, false);
    const y = linearAxis(-0.008, 0.008, 'map axis 2', String, 4, false);
    const placed = placeMapLabels(doc, box, plots, x, y);
    expect(placed.find((p) => p.id === 'sample')!.placed).toBe(true);
    expect(placed.length).toBe(MAP_LABELLED_LOTS + 1);
    expect(placed.filter((p) => p.placed).length).toBeGreaterThan(5);
    expectClear(placed);
  });
});
