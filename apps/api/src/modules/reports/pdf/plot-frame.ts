import { INK, widthOf, write } from './pen';

/** A plot area on the page in points; y grows downwards as in pdfkit. */
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface Axis {
  min: number;
  max: number;
  log: boolean;
  ticks: number[];
  format: (v: number) => string;
  label: string;
}

/** Tick step of 1, 2 or 5 × 10^k giving about `count` intervals over [min, max]. */
export function niceStep(min: number, max: number, count: number): number {
  const raw = Math.abs(max - min) / Math.max(count, 1) || 1;
  const power = 10 ** Math.floor(Math.log10(raw));
  const fraction = raw / power;
  return (fraction <= 1 ? 1 : fraction <= 2 ? 2 : fraction <= 5 ? 5 : 10) * power;
}

/** Ticks on a linear axis; with `extend`, the range is widened to whole steps. */
export function linearAxis(min: number, max: number, label: string, format: (v: number) => string, count = 5, extend = true): Axis {
  if (min === max) {
    min -= Math.abs(min) * 0.1 || 1;
    max += Math.abs(max) * 0.1 || 1;
  }
  const step = niceStep(min, max, count);
  const lo = extend ? Math.floor(min / step) * step : min;
  const hi = extend ? Math.ceil(max / step) * step : max;
  const ticks: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) ticks.push(Math.abs(t) < step * 1e-9 ? 0 : t);
  return { min: lo, max: hi, log: false, ticks, format, label };
}

/** Decade ticks on a log axis covering [min, max]. */
export function logAxis(min: number, max: number, label: string, format: (v: number) => string): Axis {
  const lo = Math.floor(Math.log10(min));
  const hi = Math.ceil(Math.log10(max));
  const ticks: number[] = [];
  for (let k = lo; k <= hi; k++) ticks.push(10 ** k);
  return { min: 10 ** lo, max: 10 ** hi, log: true, ticks, format, label };
}

/** Position of a value on an axis mapped onto [from, to] points. */
export function place(axis: Axis, v: number, from: number, to: number): number {
  const t = axis.log
    ? (Math.log10(v) - Math.log10(axis.min)) / (Math.log10(axis.max) - Math.log10(axis.min))
    : (v - axis.min) / (axis.max - axis.min);
  return from + t * (to - from);
}

export const px = (box: Box, axis: Axis, v: number): number => place(axis, v, box.x, box.x + box.w);
export const py = (box: Box, axis: Axis, v: number): number => place(axis, v, box.y + box.h, box.y);

/** Compact engineering notation: 1.2k, 350, 0.05, 3M. */
export function compact(v: number): string {
  const a = Math.abs(v);
  if (a === 0) return '0';
  if (a >= 1e6) return `${trim(v / 1e6)}M`;
  if (a >= 1e3) return `${trim(v / 1e3)}k`;
  if (a >= 1) return trim(v);
  return trim(v, 3);
}

function trim(v: number, digits = 2): string {
  return Number(v.toFixed(digits)).toString();
}

/** Tick labels read with a true minus sign (U+2212), as NIST SP 811 §10.5.3 writes numbers. */
const trueMinus = (label: string): string => label.replace(/^-(?=\d)/, '\u2212');

/** Frame, grid, ticks and axis labels; the caller draws the data clipped to the box. */
export function drawFrame(doc: PDFKit.PDFDocument, box: Box, x: Axis, y: Axis, title: string): void {
  doc.save();
  doc.lineWidth(0.4).strokeColor(INK.rule);
  for (const t of x.ticks) {
    const at = px(box, x, t);
    doc.moveTo(at, box.y).lineTo(at, box.y + box.h).stroke();
  }
  for (const t of y.ticks) {
    const at = py(box, y, t);
    doc.moveTo(box.x, at).lineTo(box.x + box.w, at).stroke();
  }
  doc.lineWidth(0.8).strokeColor(INK.muted).rect(box.x, box.y, box.w, box.h).stroke();
  doc.restore();
  for (const t of x.ticks) {
    const label = trueMinus(x.format(t));
    const w = widthOf(doc, label, 400, 6.5);
    write(doc, label, { size: 6.5, color: INK.muted, lineBreak: false }, px(box, x, t) - w / 2, box.y + box.h + 2);
  }
  for (const t of y.ticks) {
    const label = trueMinus(y.format(t));
    const w = widthOf(doc, label, 400, 6.5);
    write(doc, label, { size: 6.5, color: INK.muted, lineBreak: false }, box.x - w - 3, py(box, y, t) - 3.5);
  }
  const xw = widthOf(doc, x.label, 400, 7);
  write(doc, x.label, { size: 7, color: INK.muted, lineBreak: false }, box.x + box.w / 2 - xw / 2, box.y + box.h + 11);
  doc.save();
  const yw = widthOf(doc, y.label, 400, 7);
  doc.rotate(-90, { origin: [box.x - 30, box.y + box.h / 2] });
  write(doc, y.label, { size: 7, color: INK.muted, lineBreak: false }, box.x - 30 - yw / 2, box.y + box.h / 2 - 4);
  doc.restore();
  write(doc, title, { size: 8, weight: 600, lineBreak: false }, box.x, box.y - 12);
}

/** Runs `draw` with drawing clipped to the plot box. */
export function clipped(doc: PDFKit.PDFDocument, box: Box, draw: () => void): void {
  doc.save();
  doc.rect(box.x, box.y, box.w, box.h).clip();
  draw();
  doc.restore();
}

/** A polyline through the points, skipping any that are not finite. */
export function polyline(doc: PDFKit.PDFDocument, points: Array<[number, number]>): void {
  let pen = false;
  for (const [x, y] of points) {
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      pen = false;
      continue;
    }
    if (pen) doc.lineTo(x, y);
    else doc.moveTo(x, y);
    pen = true;
  }
}
