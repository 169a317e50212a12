import { placeLabels, type LabelRect, type LabelRequest } from '@ohmprint/contracts';
import { ReportPlots, ReportResults } from './report-data';
import { INK, widthOf, write } from './pen';
import { Axis, Box, clipped, drawFrame, linearAxis, px, py } from './plot-frame';
import { histogramBars } from './histogram-bins';

const threeDecimals = (v: number): string => Number(v.toFixed(3)).toString();

/** Histogram of the library's calibration distances with the T95/T99 lines and the sample's distance. */
export function drawDistanceHistogram(doc: PDFKit.PDFDocument, box: Box, plots: ReportPlots, results: ReportResults): void {
  const marks = [results.t95, results.t99, results.nearestDistance].filter((v): v is number => v !== null);
  const { hi, edges, counts } = histogramBars(plots, marks);
  const x = linearAxis(0, hi, 'nearest-lot distance (normalised Canberra)', threeDecimals, 5, false);
  const y = linearAxis(0, Math.max(...counts, 1), 'lots', (v) => (Number.isInteger(v) ? `${v}` : ''), 4);
  drawFrame(doc, box, x, y, 'Library spread and this sample');
  clipped(doc, box, () => {
    doc.save().fillColor(INK.tealLight).strokeColor(INK.teal).lineWidth(0.5);
    counts.forEach((c, i) => {
      if (!c) return;
      const x0 = px(box, x, edges[i]);
      const x1 = px(box, x, edges[i + 1]);
      doc.rect(x0, py(box, y, c), x1 - x0, py(box, y, 0) - py(box, y, c)).fillAndStroke();
    });
    doc.restore();
    const line = (value: number | null, color: string, dash: boolean) => {
      if (value === null) return;
      const at = px(box, x, value);
      doc.save().strokeColor(color).lineWidth(1.2);
      if (dash) doc.dash(3, { space: 2 });
      doc.moveTo(at, box.y).lineTo(at, box.y + box.h).stroke().undash().restore();
    };
    line(results.t95, INK.inconclusive, true);
    line(results.t99, INK.notConsistent, true);
    line(results.nearestDistance, INK.text, false);
  });
  drawLineLabels(doc, box, [
    [results.nearestDistance, 'sample', INK.text],
    [results.t95, 'T95', INK.inconclusive],
    [results.t99, 'T99', INK.notConsistent],
  ].flatMap(([value, text, color]) => (value === null ? [] : [{ at: px(box, x, value as number), text: text as string, color: color as string }])));
}

const LINE_LABEL = { size: 6.5, weight: 600 as const, height: 8.5 };

/**
 * Names the histogram's vertical lines at their tops with the shared placement routine: the
 * sample's label first, each label centred on its line where room allows, else beside it or
 * stacked lower; never over another label and never past the frame.
 */
export function placeLineLabels(doc: PDFKit.PDFDocument, box: Box, lines: Array<{ at: number; text: string }>) {
  const requests: LabelRequest[] = lines.map((l, i) => ({
    id: String(i),
    anchor: { x: l.at, y: box.y + 1 },
    width: widthOf(doc, l.text, LINE_LABEL.weight, LINE_LABEL.size) + 3,
    height: LINE_LABEL.height,
    sides: ['below', 'below-right', 'below-left'],
    offset: 1,
  }));
  return placeLabels(requests, { x: box.x, y: box.y, width: box.w, height: box.h }, { gap: 2 });
}

function drawLineLabels(doc: PDFKit.PDFDocument, box: Box, lines: Array<{ at: number; text: string; color: string }>): void {
  placeLineLabels(doc, box, lines).forEach((p, i) => {
    if (!p.placed) return;
    // a knockout behind the label, so the marked lines do not run through its letters
    doc.save().rect(p.x, p.y, p.width, p.height).fill('#ffffff').restore();
    write(doc, lines[i].text, { size: LINE_LABEL.size, weight: LINE_LABEL.weight, color: lines[i].color, lineBreak: false }, p.x + 1.5, p.y + 0.5);
  });
}

/** The 2-D map of the reference lots with the sample marked as a diamond. */
export function drawLotMap(doc: PDFKit.PDFDocument, box: Box, plots: ReportPlots): void {
  if (!plots.map) return;
  const { lots, sample } = plots.map;
  const xs = [...lots.map((l) => l.x), sample.x];
  const ys = [...lots.map((l) => l.y), sample.y];
  // Extra room on the right: lot labels are written to the right of their points.
  const pad = (lo: number, hi: number, right: number) => {
    const m = hi - lo || 0.01;
    return [lo - m * 0.12, hi + m * right];
  };
  const [x0, x1] = pad(Math.min(...xs), Math.max(...xs), 0.3);
  const [y0, y1] = pad(Math.min(...ys), Math.max(...ys), 0.12);
  const x = linearAxis(x0, x1, 'map axis 1', threeDecimals, 4, false);
  const y = linearAxis(y0, y1, 'map axis 2', threeDecimals, 4, false);
  drawFrame(doc, box, x, y, 'Map of the sample among the reference lots');
  clipped(doc, box, () => {
    doc.save().fillColor(INK.teal);
    for (const lot of lots) doc.circle(px(box, x, lot.x), py(box, y, lot.y), 2.2).fill();
    doc.restore();
    const sx = px(box, x, sample.x);
    const sy = py(box, y, sample.y);
    doc.save().fillColor(INK.text).polygon([sx, sy - 4.5], [sx + 4.5, sy], [sx, sy + 4.5], [sx - 4.5, sy]).fill().restore();
    for (const p of placeMapLabels(doc, box, plots, x, y)) {
      if (!p.placed) continue;
      if (p.leader) doc.save().lineWidth(0.3).strokeColor(INK.rule).moveTo(p.leader.x1, p.leader.y1).lineTo(p.leader.x2, p.leader.y2).stroke().restore();
      const isSample = p.id === 'sample';
      const text = isSample ? 'sample' : lots[Number(p.id)].label;
      write(doc, text, { size: isSample ? 6.5 : MAP_LABEL_SIZE, weight: isSample ? 600 : 400, color: isSample ? INK.text : INK.muted, lineBreak: false }, p.x, p.y);
    }
  });
}

const MAP_LABEL_SIZE = 5.5;
/** At most this many lots are named on the map: those nearest the sample, which a reader compares. */
export const MAP_LABELLED_LOTS = 12;
/** A label pushed further than this from its point would point at the wrong lot: it is left out. */
const MAX_LEADER = 24;

/**
 * Lays out the map's labels with the shared placement routine: the sample's first, then the lots
 * nearest the sample on the map (at most MAP_LABELLED_LOTS), none over another label, a point or
 * the sample's mark, none past the frame. A lot label with no room near its point is not drawn
 * (its point still is).
 */
export function placeMapLabels(doc: PDFKit.PDFDocument, box: Box, plots: ReportPlots, x: Axis, y: Axis) {
  if (!plots.map) return [];
  const { lots, sample } = plots.map;
  const points = lots.map((l) => ({ x: px(box, x, l.x), y: py(box, y, l.y) }));
  const sx = px(box, x, sample.x);
  const sy = py(box, y, sample.y);
  const obstacles: LabelRect[] = [...points.map((p) => ({ x: p.x - 2.4, y: p.y - 2.4, width: 4.8, height: 4.8 })), { x: sx - 4.6, y: sy - 4.6, width: 9.2, height: 9.2 }];
  const nearest = lots
    .map((_, i) => i)
    .sort((a, b) => Math.hypot(points[a].x - sx, points[a].y - sy) - Math.hypot(points[b].x - sx, points[b].y - sy))
    .slice(0, MAP_LABELLED_LOTS);
  const requests: LabelRequest[] = [
    { id: 'sample', anchor: { x: sx, y: sy }, width: widthOf(doc, 'sample', 600, 6.5), height: 7.8, offset: 6 },
    ...nearest.map((i) => ({ id: String(i), anchor: points[i], width: widthOf(doc, lots[i].label, 400, MAP_LABEL_SIZE), height: 6.6, offset: 3.2 })),
  ];
  return placeLabels(requests, { x: box.x + 1, y: box.y + 1, width: box.w - 2, height: box.h - 2 }, { gap: 1.5, obstacles }).map((p) =>
    p.leader && p.id !== 'sample' && Math.hypot(p.leader.x2 - p.leader.x1, p.leader.y2 - p.leader.y1) > MAX_LEADER ? { ...p, placed: false } : p,
  );
}
