import { superscriptText, type QuantityPart } from '@ohmprint/contracts';
import { fontName, InterWeight, splitIntoRuns } from './inter-fonts';

/** Colours of the report, kept together so every page reads as one document. */
export const INK = {
  text: '#1d2526',
  muted: '#5b6668',
  rule: '#c9d1d1',
  panel: '#eef3f2',
  teal: '#0f6b66',
  tealLight: '#cfe5e2',
  consistent: '#1e7a3c',
  inconclusive: '#a66300',
  notConsistent: '#b3261e',
  noVerdict: '#6b6f70',
} as const;

export interface TextStyle extends PDFKit.Mixins.TextOptions {
  weight?: InterWeight;
  size?: number;
  color?: string;
}

/**
 * Writes text that may mix Unicode subsets (see inter-fonts.ts) as one flow of pdfkit
 * `continued` runs, so wrapping and alignment still happen across the whole string.
 */
export function write(doc: PDFKit.PDFDocument, text: string, style: TextStyle = {}, x?: number, y?: number): void {
  const { weight = 400, size = 9, color = INK.text, ...options } = style;
  doc.fontSize(size).fillColor(color);
  const runs = splitIntoRuns(text.length ? text : ' ');
  runs.forEach((run, i) => {
    doc.font(fontName(run.subset, weight));
    const continued = i < runs.length - 1;
    if (i === 0 && x !== undefined) doc.text(run.text, x, y, { ...options, continued });
    else doc.text(run.text, { ...options, continued });
  });
}

/** Width in points of text set in the given weight and size. */
export function widthOf(doc: PDFKit.PDFDocument, text: string, weight: InterWeight, size: number): number {
  doc.fontSize(size);
  return splitIntoRuns(text).reduce((sum, run) => {
    doc.font(fontName(run.subset, weight));
    return sum + doc.widthOfString(run.text);
  }, 0);
}

/** Height the text would take when wrapped to `width`. */
export function heightOf(doc: PDFKit.PDFDocument, text: string, weight: InterWeight, size: number, width: number): number {
  doc.font(fontName('latin', weight)).fontSize(size);
  return doc.heightOfString(text, { width });
}

/** Subscripts are set this much smaller than the text and dropped below its baseline. */
const SUB_SCALE = 0.72;

/**
 * Writes the shared number format's runs on one line (no wrapping): superscripts as their Unicode
 * characters (drawn by the DejaVu fallback, so they copy out as 10⁻⁶), subscripts smaller and
 * lowered (Rct, Cdl, R∞). Returns the width written.
 */
export function writeParts(doc: PDFKit.PDFDocument, parts: readonly QuantityPart[], style: TextStyle, x: number, y: number): number {
  const { weight = 400, size = 9 } = style;
  let cx = x;
  for (const part of parts) {
    if (part.role === 'sub') {
      const small = size * SUB_SCALE;
      write(doc, part.text, { ...style, size: small, lineBreak: false }, cx, y + size * 0.42);
      cx += widthOf(doc, part.text, weight, small);
    } else {
      const text = part.role === 'sup' ? superscriptText(part.text) : part.text;
      write(doc, text, { ...style, lineBreak: false }, cx, y);
      cx += widthOf(doc, text, weight, size);
    }
  }
  return cx - x;
}

/** Width `writeParts` would take. */
export function partsWidth(doc: PDFKit.PDFDocument, parts: readonly QuantityPart[], weight: InterWeight, size: number): number {
  return parts.reduce(
    (sum, p) => sum + (p.role === 'sub' ? widthOf(doc, p.text, weight, size * SUB_SCALE) : widthOf(doc, p.role === 'sup' ? superscriptText(p.text) : p.text, weight, size)),
    0,
  );
}
