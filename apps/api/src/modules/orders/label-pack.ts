import PDFDocument from 'pdfkit';
import { registerInter } from '../reports/pdf/inter-fonts';
import { INK, heightOf, write } from '../reports/pdf/pen';
import { drawQr } from '../reports/pdf/qr-vector';
import { formatDate } from '../reports/pdf/report-formats';
import type { LabelPackData, LabelPackSample } from './label-pack-data';

const PAGE = { width: 595.28, height: 841.89, left: 46, right: 46, top: 52, bottom: 48 } as const;
const WIDTH = PAGE.width - PAGE.left - PAGE.right;
const LABEL = { columns: 2, rows: 5, gap: 12, height: 132 } as const;

/**
 * The printable pack a producer sends samples with: a shipping sheet (address, instructions, what
 * is in the parcel), one cut-out label per sample with its code as text and as a vector QR code,
 * and a chain-of-custody form for the sender, the carrier and the lab to sign.
 */
export function renderLabelPack(data: LabelPackData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: PAGE.top, bottom: 0, left: PAGE.left, right: PAGE.right },
    bufferPages: true,
    info: { Title: `Label pack, order ${data.orderRef}`, Author: data.lab.name, Subject: `Sample labels and custody form for ${data.product}`, Creator: 'Ohmprint' },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  registerInter(doc);
  shippingSheet(doc, data);
  labels(doc, data);
  custodyForm(doc, data);
  footers(doc, data);
  doc.end();
  return done;
}

const kindLine = (s: LabelPackSample): string =>
  s.kind === 'reference-lot' ? `Reference lot ${s.referenceLot?.lotCode ?? s.lotClaimed}` : `Check sample${s.lotClaimed ? ` · lot claimed ${s.lotClaimed}` : ''}`;

function heading(doc: PDFKit.PDFDocument, text: string, y: number): number {
  write(doc, text, { size: 11, weight: 700, color: INK.teal, lineBreak: false }, PAGE.left, y);
  doc.save().lineWidth(0.6).strokeColor(INK.tealLight).moveTo(PAGE.left, y + 16).lineTo(PAGE.left + WIDTH, y + 16).stroke().restore();
  return y + 24;
}

function shippingSheet(doc: PDFKit.PDFDocument, data: LabelPackData): void {
  let y: number = PAGE.top;
  write(doc, 'Label pack', { size: 22, weight: 700, color: INK.teal, lineBreak: false }, PAGE.left, y);
  y += 30;
  const what = data.orderKind === 'check' ? 'Check order' : 'Reference enrolment order';
  write(doc, `${what} ${data.orderRef}  ·  ${data.product} (${data.matrix})  ·  ${data.samples.length} sample${data.samples.length === 1 ? '' : 's'}`,
    { size: 10.5, weight: 600, lineBreak: false }, PAGE.left, y);
  y += 16;
  write(doc, `Placed ${formatDate(data.placedAt)} by ${data.placedBy} for ${data.client}`, { size: 9, color: INK.muted, lineBreak: false }, PAGE.left, y);
  y += 26;

  const boxH = 22 + data.shipTo.length * 15 + 10;
  doc.save().roundedRect(PAGE.left, y, WIDTH * 0.58, boxH, 6).lineWidth(1.2).strokeColor(INK.teal).stroke().restore();
  write(doc, 'SEND THE SAMPLES TO', { size: 8, weight: 700, color: INK.teal, characterSpacing: 0.8, lineBreak: false }, PAGE.left + 14, y + 10);
  data.shipTo.forEach((line, i) =>
    write(doc, line, { size: 11, weight: i === 0 ? 700 : 400, width: WIDTH * 0.58 - 28, height: 14, ellipsis: true }, PAGE.left + 14, y + 26 + i * 15));
  const fromX = PAGE.left + WIDTH * 0.62;
  write(doc, 'FROM', { size: 8, weight: 700, color: INK.muted, characterSpacing: 0.8, lineBreak: false }, fromX, y + 10);
  write(doc, data.client, { size: 10.5, weight: 600, width: WIDTH * 0.38 }, fromX, y + 26);
  y += boxH + 22;

  y = heading(doc, 'How to send them', y);
  write(doc, data.instructions, { size: 9.5, width: WIDTH }, PAGE.left, y);
  y += heightOf(doc, data.instructions, 400, 9.5, WIDTH) + 12;
  const steps = [
    'Cut out the labels on the next page and stick each one on the sample whose details it shows.',
    'Sign the chain-of-custody form (last page) when you hand the parcel over, and put it in the parcel.',
    'Enter the carrier and tracking number on the order page, so the lab knows the parcel is coming.',
  ];
  steps.forEach((step, i) => {
    doc.save().circle(PAGE.left + 8, y + 6, 8).fillColor(INK.teal).fill().restore();
    write(doc, String(i + 1), { size: 9, weight: 700, color: '#ffffff', width: 16, align: 'center', lineBreak: false }, PAGE.left, y + 1);
    write(doc, step, { size: 9.5, width: WIDTH - 26 }, PAGE.left + 24, y + 1);
    y += Math.max(20, heightOf(doc, step, 400, 9.5, WIDTH - 26) + 8);
  });
  y += 12;

  y = heading(doc, 'In this parcel', y);
  const cols = [
    { title: 'Sample code', width: 100 },
    { title: data.orderKind === 'check' ? 'Lot claimed' : 'Lot', width: 90 },
    { title: data.orderKind === 'check' ? 'Obtained' : 'Produced', width: 190 },
    { title: 'Container', width: WIDTH - 380 },
  ];
  let x = PAGE.left;
  for (const c of cols) {
    write(doc, c.title, { size: 8.5, weight: 700, color: INK.muted, lineBreak: false }, x, y);
    x += c.width;
  }
  y += 15;
  for (const s of data.samples) {
    if (y > PAGE.height - PAGE.bottom - 30) {
      doc.addPage();
      y = PAGE.top;
    }
    const cells = [s.code, s.referenceLot?.lotCode ?? (s.lotClaimed || '—'),
      s.kind === 'check' ? `${formatDate(s.obtainedOn)}, ${s.obtainedWhere}` : formatDate(s.obtainedOn), s.container || '—'];
    x = PAGE.left;
    cells.forEach((text, i) => {
      write(doc, text, { size: 9, weight: i === 0 ? 600 : 400, width: cols[i].width - 8, height: 11, ellipsis: true }, x, y);
      x += cols[i].width;
    });
    y += 14;
    doc.save().lineWidth(0.4).strokeColor(INK.rule).moveTo(PAGE.left, y - 3).lineTo(PAGE.left + WIDTH, y - 3).stroke().restore();
  }
}

function labels(doc: PDFKit.PDFDocument, data: LabelPackData): void {
  const w = (WIDTH - LABEL.gap) / LABEL.columns;
  data.samples.forEach((s, i) => {
    const slot = i % (LABEL.columns * LABEL.rows);
    if (slot === 0) {
      doc.addPage();
      write(doc, 'Sample labels — cut along the dashed lines', { size: 9, weight: 600, color: INK.muted, lineBreak: false }, PAGE.left, PAGE.top - 22);
    }
    const x = PAGE.left + (slot % LABEL.columns) * (w + LABEL.gap);
    const y = PAGE.top + Math.floor(slot / LABEL.columns) * (LABEL.height + LABEL.gap);
    doc.save().lineWidth(0.8).dash(4, { space: 3 }).strokeColor(INK.muted).rect(x, y, w, LABEL.height).stroke().undash().restore();
    const qr = 96;
    drawQr(doc, s.code, x + 10, y + (LABEL.height - qr) / 2, qr);
    const tx = x + qr + 18;
    const tw = w - qr - 26;
    write(doc, 'OHMPRINT SAMPLE', { size: 7, weight: 700, color: INK.teal, characterSpacing: 0.8, lineBreak: false }, tx, y + 14);
    write(doc, s.code, { size: 17, weight: 700, lineBreak: false }, tx, y + 26);
    write(doc, data.product, { size: 9.5, weight: 600, width: tw, height: 26, ellipsis: true }, tx, y + 52);
    write(doc, kindLine(s), { size: 8, width: tw, height: 20, ellipsis: true }, tx, y + 76);
    write(doc, `For ${data.lab.name}`, { size: 7.5, color: INK.muted, width: tw, height: 10, ellipsis: true }, tx, y + 100);
    write(doc, `Order ${data.orderRef}`, { size: 7.5, color: INK.muted, width: tw, height: 10, ellipsis: true }, tx, y + 111);
  });
}

function signatureBlock(doc: PDFKit.PDFDocument, title: string, fields: string[], x: number, y: number, w: number): number {
  const h = 26 + fields.length * 30;
  doc.save().lineWidth(0.8).strokeColor(INK.rule).rect(x, y, w, h).stroke().restore();
  write(doc, title, { size: 9.5, weight: 700, color: INK.teal, lineBreak: false }, x + 10, y + 9);
  fields.forEach((f, i) => {
    const fy = y + 30 + i * 30;
    write(doc, f, { size: 8, color: INK.muted, lineBreak: false }, x + 10, fy + 10);
    doc.save().lineWidth(0.5).strokeColor(INK.text).moveTo(x + 104, fy + 20).lineTo(x + w - 10, fy + 20).stroke().restore();
  });
  return h;
}

function custodyForm(doc: PDFKit.PDFDocument, data: LabelPackData): void {
  doc.addPage();
  let y: number = PAGE.top;
  write(doc, 'Chain-of-custody form', { size: 20, weight: 700, color: INK.teal, lineBreak: false }, PAGE.left, y);
  y += 28;
  write(doc, `Order ${data.orderRef}  ·  ${data.product}  ·  from ${data.client} to ${data.lab.name}`, { size: 10, weight: 600, lineBreak: false }, PAGE.left, y);
  y += 18;
  const intro = 'Every person who hands the samples on signs below, with the date and time. The lab records the samples’ ' +
    'condition on arrival and keeps this form with the order; each later move inside the lab is kept in its own custody record.';
  write(doc, intro, { size: 9, color: INK.muted, width: WIDTH }, PAGE.left, y);
  y += heightOf(doc, intro, 400, 9, WIDTH) + 14;

  y = heading(doc, 'Samples handed over', y);
  const cols = [
    { title: 'Sample code', width: 92 },
    { title: data.orderKind === 'check' ? 'Lot claimed' : 'Lot', width: 92 },
    { title: 'Container', width: 130 },
    { title: 'Seal intact (sender)', width: 100 },
    { title: 'Seal intact (lab)', width: WIDTH - 414 },
  ];
  let x = PAGE.left;
  for (const c of cols) {
    write(doc, c.title, { size: 8, weight: 700, color: INK.muted, lineBreak: false }, x, y);
    x += c.width;
  }
  y += 15;
  for (const s of data.samples) {
    if (y > PAGE.height - PAGE.bottom - 40) {
      doc.addPage();
      y = PAGE.top;
    }
    x = PAGE.left;
    const cells = [s.code, s.referenceLot?.lotCode ?? (s.lotClaimed || '—'), s.container || '—'];
    cells.forEach((text, i) => {
      write(doc, text, { size: 9, weight: i === 0 ? 600 : 400, width: cols[i].width - 8, height: 11, ellipsis: true }, x, y);
      x += cols[i].width;
    });
    for (const label of ['yes', 'no']) {
      doc.save().lineWidth(0.7).strokeColor(INK.text).rect(x, y, 9, 9).stroke().restore();
      write(doc, label, { size: 8, lineBreak: false }, x + 13, y + 0.5);
      x += 38;
    }
    x = PAGE.left + 414;
    for (const label of ['yes', 'no']) {
      doc.save().lineWidth(0.7).strokeColor(INK.text).rect(x, y, 9, 9).stroke().restore();
      write(doc, label, { size: 8, lineBreak: false }, x + 13, y + 0.5);
      x += 38;
    }
    y += 16;
    doc.save().lineWidth(0.4).strokeColor(INK.rule).moveTo(PAGE.left, y - 4).lineTo(PAGE.left + WIDTH, y - 4).stroke().restore();
  }
  y += 12;
  const blockH = 26 + 4 * 30;
  if (y + blockH * 2 + 20 > PAGE.height - PAGE.bottom) {
    doc.addPage();
    y = PAGE.top;
  }
  const half = (WIDTH - 14) / 2;
  signatureBlock(doc, '1  Sent by (producer)', ['Name', 'Signature', 'Date and time', 'Place'], PAGE.left, y, half);
  signatureBlock(doc, '2  Carried by', ['Carrier', `Tracking number`, 'Collected (date, time)', 'Driver’s signature'], PAGE.left + half + 14, y, half);
  if (data.carrier) write(doc, data.carrier, { size: 9, lineBreak: false }, PAGE.left + half + 14 + 106, y + 33);
  if (data.trackingNumber) write(doc, data.trackingNumber, { size: 9, lineBreak: false }, PAGE.left + half + 14 + 106, y + 63);
  y += blockH + 14;
  signatureBlock(doc, '3  Received by (lab)', ['Name', 'Signature', 'Date and time', 'Condition / temp.'], PAGE.left, y, half);
  const note = 'Sender: keep a copy or a photo of this form. Lab: file it with the order and record the arrival in the intake screen ' +
    'by scanning each label’s QR code.';
  write(doc, note, { size: 8.5, color: INK.muted, width: half - 10 }, PAGE.left + half + 24, y + 8);
}

function footers(doc: PDFKit.PDFDocument, data: LabelPackData): void {
  const range = doc.bufferedPageRange();
  for (let i = 0; i < range.count; i++) {
    doc.switchToPage(range.start + i);
    const text = `Label pack · order ${data.orderRef} · ${data.lab.name} · page ${i + 1} of ${range.count}`;
    write(doc, text, { size: 7.5, color: INK.muted, width: WIDTH, align: 'center', lineBreak: false }, PAGE.left, PAGE.height - 30);
  }
}
