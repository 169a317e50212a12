import PDFDocument from 'pdfkit';
import type { ControlChartView, CorrelationStudy, DetectionStudy, OngoingPerformance, RepeatabilityStudy } from '@ohmprint/contracts';
import { registerInter } from '../reports/pdf/inter-fonts';
import { INK, widthOf, write } from '../reports/pdf/pen';
import { compact, drawFrame, linearAxis, logAxis, px, py, type Box } from '../reports/pdf/plot-frame';
import { CONTENT_WIDTH, Flow, PAGE } from '../reports/pdf/report-layout';
import { SCREENING_CAUTION } from '../reports/pdf/report-wording';

export interface ValidationSummaryData {
  labName: string;
  generatedAt: string;
  correlation: CorrelationStudy;
  repeatability: RepeatabilityStudy;
  detection: DetectionStudy;
  performance: OngoingPerformance;
  cells: ControlChartView[];
}

/** Diverging teal–white–red for r in [−1, 1] (vector fills, no raster). */
function rColour(r: number | null): string {
  if (r === null) return '#e4e6e6';
  const t = Math.min(1, Math.abs(r));
  const [a, b] = r >= 0 ? [[15, 107, 102], [255, 255, 255]] : [[179, 38, 30], [255, 255, 255]];
  const mix = (i: number) => Math.round(b[i] + (a[i] - b[i]) * t);
  return `#${[0, 1, 2].map((i) => mix(i).toString(16).padStart(2, '0')).join('')}`;
}

const pct = (v: number | null) => (v === null ? '–' : `${(v * 100).toFixed(1)} %`);

function heatMap(doc: PDFKit.PDFDocument, flow: Flow, c: CorrelationStudy): void {
  const cols = c.chemistry.length;
  const rows = c.parameters.length;
  if (!cols || !rows) {
    flow.paragraph('No chemistry is recorded for this version’s lots, so there is nothing to correlate.');
    return;
  }
  const labelW = 70;
  const cellW = Math.min(70, (CONTENT_WIDTH - labelW) / cols);
  const cellH = 20;
  flow.ensure(30 + rows * cellH + 20);
  const top = flow.y + 24;
  c.chemistry.forEach((f, j) => write(doc, f.label, { size: 6.5, weight: 600, width: cellW - 2, align: 'center', lineBreak: true, height: 22 }, PAGE.left + labelW + j * cellW + 1, flow.y));
  c.parameters.forEach((p, i) => {
    write(doc, p.name, { size: 7, weight: 600, lineBreak: false }, PAGE.left, top + i * cellH + 6);
    c.chemistry.forEach((f, j) => {
      const cell = c.cells.find((x) => x.parameter === p.name && x.chemistry === f.field);
      const x = PAGE.left + labelW + j * cellW;
      const y = top + i * cellH;
      doc.save().rect(x, y, cellW - 1, cellH - 1).fill(rColour(cell?.r ?? null)).restore();
      const text = cell?.r === null || !cell ? `n=${cell?.n ?? 0}` : `${cell.r.toFixed(2)} (n=${cell.n})`;
      const dark = cell?.r !== null && cell !== undefined && Math.abs(cell.r) > 0.55;
      const w = widthOf(doc, text, 400, 6.5);
      write(doc, text, { size: 6.5, color: dark ? '#ffffff' : INK.text, lineBreak: false }, x + (cellW - 1 - w) / 2, y + 6);
    });
  });
  flow.y = top + rows * cellH + 6;
}

function histogram(doc: PDFKit.PDFDocument, flow: Flow, r: RepeatabilityStudy): void {
  const h = r.histogram;
  if (!h.edges.length) {
    flow.paragraph('No replicate or lot distances yet.');
    return;
  }
  flow.ensure(170);
  const box: Box = { x: PAGE.left + 40, y: flow.y + 16, w: CONTENT_WIDTH - 60, h: 120 };
  const max = Math.max(1, ...h.within, ...h.between);
  const x = logAxis(h.edges[0], h.edges[h.edges.length - 1], 'Distance (log scale)', compact);
  const y = linearAxis(0, max, 'Pairs', (v) => String(Math.round(v)), 4);
  drawFrame(doc, box, x, y, 'Replicates within a sample (teal) and pairs of lots (amber)');
  const bars = (counts: number[], colour: string, offset: number) => {
    counts.forEach((n, i) => {
      if (!n) return;
      const x0 = px(box, x, h.edges[i]);
      const x1 = px(box, x, h.edges[i + 1]);
      const w = (x1 - x0) / 2;
      doc.save().rect(x0 + offset * w, py(box, y, n), w - 0.5, box.y + box.h - py(box, y, n)).fill(colour).restore();
    });
  };
  bars(h.within, INK.teal, 0);
  bars(h.between, INK.inconclusive, 1);
  flow.y = box.y + box.h + 26;
}

function controlPlot(doc: PDFKit.PDFDocument, flow: Flow, c: ControlChartView): void {
  flow.ensure(150);
  const values = c.runs.map((r) => r.cellConstantPerCm);
  if (values.length < 2) {
    flow.paragraph(`${c.cell.name}: ${c.status.message}`);
    return;
  }
  const box: Box = { x: PAGE.left + 40, y: flow.y + 16, w: CONTENT_WIDTH - 60, h: 95 };
  const all = [...values, ...(c.upperLimit !== null ? [c.upperLimit, c.lowerLimit as number] : [])];
  const x = linearAxis(1, values.length, 'Standard run', (v) => String(Math.round(v)), 6, false);
  const y = linearAxis(Math.min(...all), Math.max(...all), 'K (cm⁻¹)', (v) => v.toFixed(4), 4);
  drawFrame(doc, box, x, y, `${c.cell.name}: cell constant over time`);
  const hline = (v: number | null, dash: boolean) => {
    if (v === null) return;
    doc.save().lineWidth(0.7).strokeColor(dash ? INK.notConsistent : INK.muted);
    if (dash) doc.dash(3, { space: 2 });
    doc.moveTo(box.x, py(box, y, v)).lineTo(box.x + box.w, py(box, y, v)).stroke().restore();
  };
  hline(c.centre, false);
  hline(c.upperLimit, true);
  hline(c.lowerLimit, true);
  doc.save().lineWidth(0.8).strokeColor(INK.teal);
  values.forEach((v, i) => (i ? doc.lineTo(px(box, x, i + 1), py(box, y, v)) : doc.moveTo(px(box, x, 1), py(box, y, v))));
  doc.stroke().restore();
  c.runs.forEach((r, i) => {
    const broken = r.signals.length > 0;
    doc.save().circle(px(box, x, i + 1), py(box, y, r.cellConstantPerCm), broken ? 2.6 : 1.8).fill(broken ? INK.notConsistent : INK.teal).restore();
  });
  flow.y = box.y + box.h + 24;
  flow.paragraph(c.status.message, 8);
}

/** The lab's validation file: a vector PDF of one library version's validation and the bench's control charts. */
export function renderValidationSummary(data: ValidationSummaryData): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A4', bufferPages: true, margins: { top: PAGE.top, bottom: 0, left: PAGE.left, right: PAGE.right }, info: { Title: `Method validation summary: ${data.correlation.productName} v${data.correlation.version}`, Author: data.labName } });
  registerInter(doc);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const flow = new Flow(doc);
  const c = data.correlation;
  write(doc, 'Method validation summary', { size: 16, weight: 700, color: INK.teal, lineBreak: false }, PAGE.left, flow.y);
  flow.y += 22;
  flow.paragraph(`${data.labName} · ${c.productName}, library version ${c.version} · model ${c.model} · generated ${data.generatedAt.slice(0, 16).replace('T', ' ')} UTC`, 8.5, INK.muted);
  flow.gap(4);
  flow.paragraph(SCREENING_CAUTION, 7.5, INK.muted);

  flow.heading('Fitted parameters against lot chemistry (Pearson r, n lots)');
  heatMap(doc, flow, c);
  const strongest = [...c.cells].filter((x) => x.r !== null).sort((a, b) => Math.abs(b.r as number) - Math.abs(a.r as number)).slice(0, 6);
  for (const s of strongest) flow.paragraph(`${s.parameter} × ${s.chemistry}: r = ${(s.r as number).toFixed(3)}, p = ${(s.p as number).toPrecision(3)}, n = ${s.n}`, 8);
  if (c.lotsNotFitted.length) flow.paragraph(`Lots whose fit did not converge (left out): ${c.lotsNotFitted.join(', ')}`, 8);

  const r = data.repeatability;
  flow.heading('Repeatability');
  flow.paragraph(
    `${r.within.count} replicate pairs in ${r.within.samples} samples: median ${r.within.median?.toPrecision(3) ?? '–'}, 95th percentile ${r.within.p95?.toPrecision(3) ?? '–'}. ` +
      `${r.between.count} pairs of lots: median ${r.between.median?.toPrecision(3) ?? '–'}, 5th percentile ${r.between.p5?.toPrecision(3) ?? '–'}.` +
      (r.ratio ? ` Lots differ ${r.ratio.toPrecision(3)} times more than replicates (medians).` : '') +
      (r.synthesisedForDemo ? ' Includes invented demo sweeps.' : ''),
  );
  histogram(doc, flow, r);

  const d = data.detection;
  flow.heading(`Detection study: ${d.productName}${d.synthesisedForDemo ? ' (includes invented demo trials)' : ''}`);
  flow.paragraph(d.detectionRule, 8, INK.muted);
  if (!d.series.length) flow.paragraph('No deliberate mixtures recorded yet.');
  for (const s of d.series) {
    flow.paragraph(`${s.admixture === 'water' ? 'Water' : 'Other product'}: ${s.admixtureName} — lowest level reliably detected: ${s.lowestReliableLevelPercent === null ? 'none' : `${s.lowestReliableLevelPercent} %`}`, 8.5, INK.text, 600);
    for (const l of s.levels) {
      flow.paragraph(`${l.levelPercent} %: ${l.total} trials — not consistent ${l.counts.notConsistent}, inconclusive ${l.counts.inconclusive}, consistent ${l.counts.consistent}${l.counts.noVerdict ? `, no verdict ${l.counts.noVerdict}` : ''} (${pct(l.notConsistentShare)} not consistent${l.reliablyDetected ? ', reliably detected' : ''})`, 8);
    }
  }

  const p = data.performance;
  flow.heading('Ongoing performance: authentic lots sent blind');
  flow.paragraph(`${p.notConsistent} of ${p.total} called not consistent (${pct(p.observedRate)}); the decision rule promises at most ${pct(p.promisedRate)}.${p.pValue !== null ? ` p = ${p.pValue.toPrecision(3)}.` : ''}`);
  flow.paragraph(p.test, 8, INK.muted);
  if (p.warning) flow.paragraph(`Warning: ${p.warning}`, 8.5, INK.notConsistent, 600);

  flow.heading('Control standards');
  flow.paragraph(data.cells[0]?.baselineRule ?? 'No cells.', 8, INK.muted);
  if (data.cells[0]) flow.paragraph(`Rules: ${data.cells[0].rules.map((x) => x.description).join('; ')} (Ohmprint’s rules, common SPC practice).`, 8, INK.muted);
  for (const cell of data.cells) controlPlot(doc, flow, cell);

  flow.ensure(20);
  flow.gap(6);
  flow.paragraph('End of validation summary.', 8, INK.muted, 600);
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    write(doc, `${c.productName} v${c.version} · method validation · page ${i + 1} of ${range.count}`, { size: 7, color: INK.muted, lineBreak: false }, PAGE.left, PAGE.height - 40);
  }
  doc.end();
  return done;
}
