import { ReportPlots, ReportResults } from './report-data';
import { INK, widthOf, write } from './pen';
import { Box, clipped, drawFrame, linearAxis, px, py } from './plot-frame';
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
  const labels: Array<[number | null, string, string]> = [
    [results.t95, 'T95', INK.inconclusive],
    [results.t99, 'T99', INK.notConsistent],
    [results.nearestDistance, 'sample', INK.text],
  ];
  let lastRight = -Infinity;
  let row = 0;
  // left to right, so each label only has to clear the one drawn before it
  labels.sort((a, b) => (a[0] ?? 0) - (b[0] ?? 0));
  for (const [value, text, color] of labels) {
    if (value === null) continue;
    const at = px(box, x, value);
    const w = widthOf(doc, text, 600, 6.5);
    row = at - w / 2 < lastRight + 2 ? row + 1 : 0;
    const left = Math.min(at - w / 2, box.x + box.w - w);
    const top = box.y + 2 + row * 9;
    // a knockout behind the label, so the marked lines do not run through its letters
    doc.save().rect(left - 1.5, top - 0.5, w + 3, 8.5).fill('#ffffff').restore();
    write(doc, text, { size: 6.5, weight: 600, color, lineBreak: false }, left, top);
    lastRight = at + w / 2;
  }
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
    for (const lot of lots) write(doc, lot.label, { size: 5.5, color: INK.muted, lineBreak: false }, px(box, x, lot.x) + 3, py(box, y, lot.y) - 3);
    const sx = px(box, x, sample.x);
    const sy = py(box, y, sample.y);
    doc.save().fillColor(INK.text).polygon([sx, sy - 4.5], [sx + 4.5, sy], [sx, sy + 4.5], [sx - 4.5, sy]).fill().restore();
    write(doc, 'sample', { size: 6.5, weight: 600, lineBreak: false }, sx + 6, sy - 4);
  });
}
