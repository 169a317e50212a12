import PDFDocument from 'pdfkit';
import { followsText, measurementTemperatureText, referralText } from './temperature-wording';
import { ReportData } from './report-data';
import { registerInter } from './inter-fonts';
import { MATRIX_LABELS, describeWithoutSymbol, formatQuantity, formatSymbol, sameLotCode } from '@ohmprint/contracts';
import { INK, widthOf, write, writeParts } from './pen';
import { CONTENT_WIDTH, Flow, PAGE } from './report-layout';
import { drawBode, drawNyquist } from './spectrum-plots';
import { MAP_LABELLED_LOTS, drawDistanceHistogram, drawLotMap } from './library-plots';
import { drawVerdict } from './verdict-badge';
import { drawQr } from './qr-vector';
import { DEMO_MARK, ITEMS_TESTED, REPRODUCTION, SAFETY_NOTE, SCREENING_CAUTION, decisionRule, thresholdStatement } from './report-wording';
import { formatDate, formatDateTime, formatHz, formatNumber, formatPercent } from './report-formats';

/**
 * Renders a test report as an unsigned PDF (signing is a separate step, so the bytes signed are
 * exactly these). Content follows ISO/IEC 17025:2017 clause 7.8.2.1 in substance: identification
 * on every page with page x of y, lab, client, item and its condition, dates, method, results with
 * the decision rule (7.8.6), statements, authorisation and a marked end.
 */
export interface RenderOptions {
  /** The lab's logo (PNG or JPEG bytes), drawn in the header of every page; omitted when absent or unreadable. */
  logo?: Buffer | null;
}

export function renderReportPdf(data: ReportData, options: RenderOptions = {}): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: PAGE.top, bottom: 0, left: PAGE.left, right: PAGE.right },
    bufferPages: true,
    autoFirstPage: true,
    info: {
      Title: `Test report ${data.reportNumber}`,
      Author: data.lab.name,
      Subject: `Impedance fingerprint screening of sample ${data.sample.code}`,
      Creator: 'Ohmprint',
      CreationDate: new Date(data.issuedAt),
    },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  registerInter(doc);
  const flow = new Flow(doc);
  writeTitle(flow, data);
  writeParties(flow, data);
  writeSample(flow, data);
  writeResult(flow, data);
  writeMethod(flow, data);
  writePlots(flow, data);
  writeParameters(flow, data);
  writeStatements(flow, data);
  writeAuthorisation(flow, data);
  writePageFrames(doc, data, openLogo(doc, options.logo));
  doc.end();
  return done;
}

function writeTitle(flow: Flow, data: ReportData): void {
  const { doc } = flow;
  write(doc, 'Test report', { size: 20, weight: 700, color: INK.teal, lineBreak: false }, PAGE.left, flow.y);
  flow.y += 26;
  write(doc, 'Impedance fingerprint screening against a reference library', { size: 11, weight: 600, lineBreak: false }, PAGE.left, flow.y);
  flow.y += 18;
  write(doc, `Report ${data.reportNumber}   ·   issued ${formatDate(data.issuedAt)}`, { size: 9, color: INK.muted, lineBreak: false }, PAGE.left, flow.y);
  flow.y += 16;
  if (data.replaces) {
    const text =
      `Amended report. This report replaces report ${data.replaces.reportNumber}, which is withdrawn and ` +
      `superseded by this one. Reason for the amendment: ${data.replaces.reason}`;
    panel(flow, text, INK.inconclusive);
  }
  const follows = followsText(data);
  if (follows) panel(flow, follows, INK.inconclusive);
}

function panel(flow: Flow, text: string, accent: string): void {
  const { doc } = flow;
  doc.font('inter-latin-400').fontSize(8.5);
  const h = doc.heightOfString(text, { width: CONTENT_WIDTH - 20 }) + 12;
  flow.ensure(h + 6);
  doc.save().fillColor(INK.panel).rect(PAGE.left, flow.y, CONTENT_WIDTH, h).fill();
  doc.fillColor(accent).rect(PAGE.left, flow.y, 3, h).fill().restore();
  write(doc, text, { size: 8.5, width: CONTENT_WIDTH - 20 }, PAGE.left + 12, flow.y + 6);
  flow.y += h + 8;
}

function writeParties(flow: Flow, data: ReportData): void {
  const { lab, client } = data;
  flow.columns(
    {
      title: 'Laboratory',
      rows: [
        ['Name', lab.name],
        ['Address', lab.address.join(', ') || 'not stated'],
        ['Accreditation', lab.accreditation ? `${lab.accreditation.body}, ${lab.accreditation.number}` : 'not accredited for this method'],
        ['Tests done at', lab.siteOfTesting ?? 'the address above'],
        ...(lab.contactEmail ? ([['Contact', lab.contactEmail]] as Array<[string, string]>) : []),
      ],
    },
    {
      title: 'Client',
      rows: [
        ['Organisation', client.name],
        ...(client.address?.length ? ([['Address', client.address.join(', ')]] as Array<[string, string]>) : []),
        ['Contact', client.contactName],
        ['E-mail', client.contactEmail],
      ],
    },
  );
}

/** A matrix code in words ("fruit juice"); reports stored before codes were used keep their text. */
function matrixInWords(matrix: string): string {
  const label = (MATRIX_LABELS as Readonly<Record<string, string>>)[matrix];
  return label ? label.toLowerCase() : matrix;
}

function writeSample(flow: Flow, data: ReportData): void {
  const s = data.sample;
  const rows: Array<[string, string]> = [
    ['Sample code', s.code],
    ['Product', `${s.productName} (${matrixInWords(s.matrix)})`],
    ['Lot claimed on the item', s.claimedLot ?? 'none stated'],
    ['Obtained', [s.obtainedWhere, s.obtainedOn ? formatDate(s.obtainedOn) : null].filter(Boolean).join(', ') || 'not stated by the client'],
    ['Label text', s.labelText ?? 'not recorded'],
    ['Received', formatDateTime(s.receivedAt)],
    ['Condition on receipt', s.conditionOnReceipt],
    ['Tested', data.testedFrom === data.testedTo ? formatDate(data.testedFrom) : `${formatDate(data.testedFrom)} to ${formatDate(data.testedTo)}`],
    ['Report issued', formatDate(data.issuedAt)],
  ];
  flow.heading('Item tested', flow.rows(rows, undefined, undefined, 130, false));
  flow.y += flow.rows(rows);
}

function writeResult(flow: Flow, data: ReportData): void {
  const r = data.results;
  flow.heading('Result', 150);
  flow.ensure(150);
  const { doc } = flow;
  const top = flow.y;
  doc.save().fillColor(INK.panel).roundedRect(PAGE.left, top, CONTENT_WIDTH, 34, 4).fill().restore();
  drawVerdict(doc, r.verdict, PAGE.left + 10, top + 8, 18);
  flow.y = top + 42;
  const rows: Array<[string, string]> = [
    ['Nearest distance', r.nearestDistance === null ? 'not available' : `${formatNumber(r.nearestDistance, 3)} (normalised Canberra distance, 0 to 1)`],
    ['Nearest reference lot', r.nearestLot === null ? 'not available' : nearestLotText(r.nearestLot, r.nearestLotProducerCode ?? null)],
    ...(r.claimedLotCheck ? ([['Claimed lot', claimedLotSentence(r.claimedLotCheck, r.nearestLotProducerCode ?? null)]] as Array<[string, string]>) : []),
    ['Thresholds', `T95 = ${r.t95 === null ? 'not available' : formatNumber(r.t95, 3)}   ·   T99 = ${r.t99 === null ? 'not available' : formatNumber(r.t99, 3)}`],
    ['Typicality', r.typicality === null ? 'not available' : `${formatPercent(r.typicality)} of the library's calibration distances are larger than the sample's`],
  ];
  flow.y += flow.rows(rows);
  flow.gap(2);
  flow.paragraph(decisionRule(data), 8.5, INK.text, 600);
  const thresholds = thresholdStatement(data);
  if (thresholds) flow.paragraph(thresholds, 8.5, INK.text, 600);
}

/** Our lot code, with the producer's own code beside it when it differs. */
export function nearestLotText(lotCode: string, producerCode: string | null): string {
  if (!producerCode) return `${lotCode} (no producer's lot code on record)`;
  return sameLotCode(lotCode, producerCode) ? `${lotCode} (the producer's lot code)` : `${lotCode}, the producer's lot ${producerCode}`;
}

/** Whether the nearest lot is the lot claimed for the item, in one sentence. */
export function claimedLotSentence(check: { lotCode: string; nearestIsClaimed: boolean | null }, producerCode: string | null): string {
  if (check.nearestIsClaimed === true) return `The nearest lot is the lot claimed for the item (${check.lotCode}).`;
  if (check.nearestIsClaimed === false) {
    return (
      `The nearest lot is not the lot claimed for the item: the item claims ${check.lotCode}, the nearest lot is the producer's ${producerCode ?? 'another lot'}. ` +
      'Lots of one product can lie close together; this does not change the verdict above.'
    );
  }
  return `The item claims lot ${check.lotCode}; whether the nearest lot is that lot cannot be said, as the nearest lot has no producer's lot code on record.`;
}

function writeMethod(flow: Flow, data: ReportData): void {
  const m = data.method;
  const rows: Array<[string, string]> = [
    ['Method', m.methodVersion ? `${m.methodVersion.name}, version ${m.methodVersion.version}: ${m.name}` : m.name],
    ['Frequency band', `${formatHz(m.bandHz.min)} to ${formatHz(m.bandHz.max)}, ${m.gridPoints} log-spaced points`],
    ...(measurementTemperatureText(data) ? ([['Measurement temperature', measurementTemperatureText(data)]] as Array<[string, string]>) : []),
    ['Temperature referral', referralText(data)],
    ['Model fitted', m.modelName],
    ['Similarity', 'Canberra distance over real and imaginary parts, divided by the number of terms'],
    ['Reference library', `${m.library.productName}, version ${m.library.version} (${m.library.lotCount} lots, published ${formatDate(m.library.publishedAt)})`],
    ['Replicates', `${m.replicateCount} measured and averaged`],
    ['Software', `Ohmprint spectral engine ${m.engineVersion}`],
    ['Deviations', m.deviations.length ? m.deviations.join('; ') : 'none from the documented method'],
  ];
  flow.heading('Method', flow.rows(rows, undefined, undefined, 130, false));
  flow.y += flow.rows(rows);
}

function writePlots(flow: Flow, data: ReportData): void {
  flow.heading('Spectra', 16 + 215 + 26 + 24);
  const top = flow.y + 16;
  const plotH = 215;
  const nyW = 220;
  drawNyquist(flow.doc, { x: PAGE.left + 38, y: top, w: nyW, h: plotH }, data.plots);
  const bodeX = PAGE.left + 38 + nyW + 50;
  const bodeW = PAGE.left + CONTENT_WIDTH - bodeX;
  const halfH = (plotH - 34) / 2;
  drawBode(flow.doc, { x: bodeX, y: top, w: bodeW, h: halfH }, { x: bodeX, y: top + halfH + 34, w: bodeW, h: halfH }, data.plots, data.method.bandHz);
  flow.y = top + plotH + 26;
  flow.paragraph(
    'Sample: teal line. Shaded light teal: the spread of the reference lots (in the Nyquist plot, the region their Z′ and −Z″ span at each frequency); grey in the Bode plots: the method band. ' +
      'Both plots show the averaged, normalised spectrum of the replicates.',
    7.5,
    INK.muted,
  );
  flow.heading('The sample and the library', 16 + 170 + 26 + 24);
  const top2 = flow.y + 16;
  const w2 = (CONTENT_WIDTH - 38 - 50 - 14) / 2;
  drawDistanceHistogram(flow.doc, { x: PAGE.left + 38, y: top2, w: w2, h: 170 }, data.plots, data.results);
  if (data.plots.map) drawLotMap(flow.doc, { x: PAGE.left + 38 + w2 + 50, y: top2, w: w2, h: 170 }, data.plots);
  flow.y = top2 + 170 + 26;
  flow.paragraph(
    "Left: how far each reference lot lies from its nearest other lot, with the thresholds and this sample's nearest distance. " +
      (data.plots.map
        ? 'Right: classical multidimensional scaling of the distances between the lots and the sample; closeness on the map mirrors closeness of the spectra.' +
          (data.plots.map.lots.length > MAP_LABELLED_LOTS ? ` Named: up to ${MAP_LABELLED_LOTS} lots nearest the sample, where room allows.` : '')
        : 'No map is drawn: the library holds too few lots for one.'),
    7.5,
    INK.muted,
  );
}

function writeParameters(flow: Flow, data: ReportData): void {
  const r = data.results;
  const rowH = 14;
  flow.heading('Fitted model parameters and data quality', rowH * (r.fittedParameters.length + 1) + 60);
  const { doc } = flow;
  const cols = [PAGE.left, PAGE.left + 200, PAGE.left + 250, PAGE.left + 400];
  ['Parameter', 'Symbol', 'Value ± standard error', 'Unit'].forEach((h, i) => write(doc, h, { size: 8, weight: 600, color: INK.muted, lineBreak: false }, cols[i], flow.y));
  flow.y += rowH;
  for (const p of r.fittedParameters) {
    flow.ensure(rowH);
    const symbol = formatSymbol(p.name);
    const value = formatQuantity(p.value, { standardError: p.standardError, significant: 4 });
    write(doc, describeWithoutSymbol(p.description ?? p.name, p.name), { size: 8.5, lineBreak: false }, cols[0], flow.y);
    writeParts(doc, symbol.parts, { size: 8.5 }, cols[1], flow.y);
    const valueParts = p.standardError === null ? [...value.parts, { text: ' (SE not estimated)', role: 'normal' as const }] : value.parts;
    writeParts(doc, valueParts, { size: 8.5 }, cols[2], flow.y);
    write(doc, p.unit && p.unit !== '1' ? p.unit : 'none (dimensionless)', { size: 8.5, lineBreak: false }, cols[3], flow.y);
    flow.y += rowH;
  }
  if (r.fittedParameters.length) {
    flow.paragraph('Each value is rounded to the last decimal place of its standard error, which keeps one or two significant digits.', 7.5, INK.muted);
  } else flow.paragraph('No model was fitted.');
  if (r.goodnessOfFit !== null) flow.paragraph(`Goodness of fit (weighted χ²${r.fitWeighting ? `, ${r.fitWeighting}` : ''}): ${formatNumber(r.goodnessOfFit, 2)}`);
  flow.gap(2);
  if (r.qualityFlags.length === 0) flow.paragraph('Data quality: no flags raised.');
  else for (const q of r.qualityFlags) flow.paragraph(`${q.severity === 'warning' ? 'Warning' : 'Note'}: ${q.message}`);
}

function writeStatements(flow: Flow, data: ReportData): void {
  flow.heading('Remarks and statements');
  flow.paragraph(`Analyst's remarks: ${data.remarks?.trim() || 'none'}`);
  flow.paragraph(ITEMS_TESTED, 8.5, INK.text, 600);
  panel(flow, `Screening caution. ${SCREENING_CAUTION}`, INK.teal);
  flow.paragraph(`Safety. ${SAFETY_NOTE}`);
  flow.paragraph(REPRODUCTION);
}

function writeAuthorisation(flow: Flow, data: ReportData): void {
  const qr = 84;
  flow.heading('Authorisation and verification', qr + 40);
  const { doc } = flow;
  const top = flow.y;
  const textW = CONTENT_WIDTH - qr - 16;
  const rows: Array<[string, string]> = [
    ['Analysed by', `${data.analyst.name}, ${data.analyst.role}`],
    ['Authorised by', `${data.authorisedBy.name}, ${data.authorisedBy.role}, on ${formatDate(data.issuedAt)}`],
    ['Signature', `Digitally signed in this PDF by ${data.lab.name}.`],
    ['Verify at', data.verification.url.replace(/\?.*$/, '')],
    ['Report number', data.reportNumber],
    ['Verification code', data.verification.code],
  ];
  flow.y += flow.rows(rows, PAGE.left, textW, 100);
  drawQr(doc, data.verification.url, PAGE.left + CONTENT_WIDTH - qr, top, qr);
  flow.y = Math.max(flow.y, top + qr) + 14;
  flow.ensure(20);
  const end = '— End of report —';
  doc.save().lineWidth(0.6).strokeColor(INK.rule).moveTo(PAGE.left, flow.y).lineTo(PAGE.left + CONTENT_WIDTH, flow.y).stroke().restore();
  write(doc, end, { size: 9, weight: 700, color: INK.muted, lineBreak: false }, PAGE.left + CONTENT_WIDTH / 2 - widthOf(doc, end, 700, 9) / 2, flow.y + 6);
}

/** The header logo's box: at most this wide and tall (points), above the header rule at y = 44. */
const LOGO_BOX = { width: 110, height: 26, top: 14 } as const;

interface PlacedLogo {
  image: PDFKit.Mixins.ImageSrc;
  width: number;
  height: number;
}

/**
 * Opens the logo once (embedded once, drawn on every page), scaled to fit the header box with its
 * aspect ratio kept. A logo pdfkit cannot read is left out rather than stopping the report.
 */
function openLogo(doc: PDFKit.PDFDocument, logo: Buffer | null | undefined): PlacedLogo | null {
  if (!logo?.length) return null;
  try {
    const image = (doc as unknown as { openImage(src: Buffer): { width: number; height: number } }).openImage(logo);
    const scale = Math.min(LOGO_BOX.width / image.width, LOGO_BOX.height / image.height);
    return { image: image as unknown as PDFKit.Mixins.ImageSrc, width: image.width * scale, height: image.height * scale };
  } catch {
    return null;
  }
}

/** Header and footer on every page, drawn last so "page x of y" knows y. */
function writePageFrames(doc: PDFKit.PDFDocument, data: ReportData, logo: PlacedLogo | null): void {
  const { start, count } = doc.bufferedPageRange();
  for (let i = start; i < start + count; i++) {
    doc.switchToPage(i);
    const right = PAGE.width - PAGE.right;
    let nameX = PAGE.left;
    if (logo) {
      // bottom-aligned with the lab's name, just above the rule
      doc.image(logo.image, PAGE.left, LOGO_BOX.top + LOGO_BOX.height - logo.height, { width: logo.width, height: logo.height });
      nameX += logo.width + 8;
    }
    write(doc, data.lab.name, { size: 8, weight: 600, color: INK.teal, lineBreak: false }, nameX, 30);
    const id = `Test report ${data.reportNumber}`;
    write(doc, id, { size: 8, weight: 600, lineBreak: false }, right - widthOf(doc, id, 600, 8), 30);
    if (data.demo) {
      const mid = PAGE.left + CONTENT_WIDTH / 2 - widthOf(doc, DEMO_MARK, 700, 7.5) / 2;
      write(doc, DEMO_MARK, { size: 7.5, weight: 700, color: INK.inconclusive, lineBreak: false }, mid, 16);
    }
    doc.save().lineWidth(0.6).strokeColor(INK.rule).moveTo(PAGE.left, 44).lineTo(right, 44).stroke().restore();
    const y = PAGE.height - 40;
    doc.save().lineWidth(0.6).strokeColor(INK.rule).moveTo(PAGE.left, y - 6).lineTo(right, y - 6).stroke().restore();
    write(doc, `Report ${data.reportNumber}`, { size: 7.5, color: INK.muted, lineBreak: false }, PAGE.left, y);
    const pageText = `Page ${i - start + 1} of ${count}`;
    write(doc, pageText, { size: 7.5, weight: 600, color: INK.muted, lineBreak: false }, right - widthOf(doc, pageText, 600, 7.5), y);
    const note = 'Results relate only to the item tested.';
    write(doc, note, { size: 7.5, color: INK.muted, lineBreak: false }, PAGE.left + CONTENT_WIDTH / 2 - widthOf(doc, note, 400, 7.5) / 2, y);
  }
}
