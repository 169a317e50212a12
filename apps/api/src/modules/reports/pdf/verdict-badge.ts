import { ReportVerdict } from './report-data';
import { INK, widthOf, write } from './pen';

/** Icon and word for each verdict: shape and text carry the meaning, colour only supports it. */
export const VERDICT_WORDS: Record<ReportVerdict, string> = {
  consistent: 'Consistent with the reference library',
  inconclusive: 'Inconclusive',
  'not-consistent': 'Not consistent with the reference library',
  'no-verdict': 'No verdict',
};

const COLOURS: Record<ReportVerdict, string> = {
  consistent: INK.consistent,
  inconclusive: INK.inconclusive,
  'not-consistent': INK.notConsistent,
  'no-verdict': INK.noVerdict,
};

/** Draws the icon (check, question mark, warning triangle, dash) and the verdict words. */
export function drawVerdict(doc: PDFKit.PDFDocument, verdict: ReportVerdict, x: number, y: number, size = 18): number {
  const c = COLOURS[verdict];
  const r = size / 2;
  const cx = x + r;
  const cy = y + r;
  doc.save().lineWidth(size / 9).strokeColor(c).fillColor(c).lineCap('round').lineJoin('round');
  if (verdict === 'not-consistent') {
    doc.polygon([cx, y], [x + size, y + size], [x, y + size]).stroke();
    doc.moveTo(cx, y + size * 0.35).lineTo(cx, y + size * 0.68).stroke();
    doc.circle(cx, y + size * 0.83, size / 16).fill();
  } else {
    doc.circle(cx, cy, r).stroke();
    if (verdict === 'consistent') {
      doc.moveTo(x + size * 0.28, cy).lineTo(x + size * 0.44, y + size * 0.68).lineTo(x + size * 0.74, y + size * 0.34).stroke();
    } else if (verdict === 'inconclusive') {
      doc.moveTo(x + size * 0.36, y + size * 0.36)
        .bezierCurveTo(x + size * 0.36, y + size * 0.12, x + size * 0.66, y + size * 0.14, x + size * 0.65, y + size * 0.37)
        .bezierCurveTo(x + size * 0.64, y + size * 0.5, cx, y + size * 0.5, cx, y + size * 0.62)
        .stroke();
      doc.circle(cx, y + size * 0.78, size / 16).fill();
    } else {
      doc.moveTo(x + size * 0.3, cy).lineTo(x + size * 0.7, cy).stroke();
    }
  }
  doc.restore();
  const words = VERDICT_WORDS[verdict];
  write(doc, words, { size: size * 0.7, weight: 700, color: c, lineBreak: false }, x + size + 8, y + size / 2 - size * 0.42);
  return size + 8 + widthOf(doc, words, 700, size * 0.7);
}
