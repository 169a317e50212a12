import { INK, heightOf, write } from './pen';

/** Page geometry (A4 in points) and the flowing cursor every section writes through. */
export const PAGE = { width: 595.28, height: 841.89, left: 50, right: 50, top: 70, bottom: 62 } as const;
export const CONTENT_WIDTH = PAGE.width - PAGE.left - PAGE.right;

export class Flow {
  y: number = PAGE.top;

  constructor(readonly doc: PDFKit.PDFDocument) {}

  get bottomLimit(): number {
    return PAGE.height - PAGE.bottom;
  }

  /** Starts a new page unless `height` more points fit on this one. */
  ensure(height: number): void {
    if (this.y + height > this.bottomLimit) this.newPage();
  }

  newPage(): void {
    this.doc.addPage();
    this.y = PAGE.top;
  }

  gap(points: number): void {
    this.y += points;
  }

  /** A section heading, on a new page unless it and `keepWith` points of what follows fit here. */
  heading(text: string, keepWith = 13): void {
    this.ensure(Math.min(27 + keepWith, this.bottomLimit - PAGE.top));
    this.gap(6);
    write(this.doc, text, { size: 10.5, weight: 700, color: INK.teal, lineBreak: false }, PAGE.left, this.y);
    this.y += 15;
    this.doc.save().lineWidth(0.6).strokeColor(INK.tealLight).moveTo(PAGE.left, this.y).lineTo(PAGE.left + CONTENT_WIDTH, this.y).stroke().restore();
    this.y += 6;
  }

  paragraph(text: string, size = 8.5, color: string = INK.text, weight: 400 | 600 | 700 = 400): void {
    const h = heightOf(this.doc, text, weight, size, CONTENT_WIDTH) + 2;
    this.ensure(h);
    write(this.doc, text, { size, color, weight, width: CONTENT_WIDTH, lineGap: 1 }, PAGE.left, this.y);
    this.y += h + 4;
  }

  /** Label–value rows in a column; returns the height used. */
  rows(rows: Array<[string, string]>, x: number = PAGE.left, width: number = CONTENT_WIDTH, labelWidth = 130, draw = true): number {
    const valueWidth = width - labelWidth - 6;
    let used = 0;
    for (const [label, value] of rows) {
      const h = Math.max(heightOf(this.doc, label, 600, 8, labelWidth), heightOf(this.doc, value, 400, 8.5, valueWidth)) + 3;
      if (draw) {
        write(this.doc, label, { size: 8, weight: 600, color: INK.muted, width: labelWidth }, x, this.y + used + 0.5);
        write(this.doc, value, { size: 8.5, width: valueWidth }, x + labelWidth + 6, this.y + used);
      }
      used += h;
    }
    return used;
  }

  /** Two label–value columns side by side, each with a small heading. */
  columns(left: { title: string; rows: Array<[string, string]> }, right: { title: string; rows: Array<[string, string]> }): void {
    const gutter = 18;
    const w = (CONTENT_WIDTH - gutter) / 2;
    const height = Math.max(this.rows(left.rows, PAGE.left, w, 78, false), this.rows(right.rows, PAGE.left + w + gutter, w, 78, false)) + 16;
    this.ensure(height + 8);
    for (const [col, x] of [[left, PAGE.left], [right, PAGE.left + w + gutter]] as const) {
      write(this.doc, col.title, { size: 10.5, weight: 700, color: INK.teal, lineBreak: false }, x, this.y);
      this.doc.save().lineWidth(0.6).strokeColor(INK.tealLight).moveTo(x, this.y + 15).lineTo(x + w, this.y + 15).stroke().restore();
    }
    this.y += 20;
    const start = this.y;
    this.rows(left.rows, PAGE.left, w, 78);
    this.y = start;
    this.rows(right.rows, PAGE.left + w + gutter, w, 78);
    this.y = start + height - 12;
  }
}
