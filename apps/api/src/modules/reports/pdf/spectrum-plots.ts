import { ReportPlots } from './report-data';
import { INK } from './pen';
import { nyquistBandPolygons } from './nyquist-band';
import { Axis, Box, clipped, compact, drawFrame, linearAxis, logAxis, niceStep, polyline, px, py } from './plot-frame';

const finite = (values: number[]): number[] => values.filter((v) => Number.isFinite(v));

/**
 * Nyquist plot (Z′ against −Z″) with one scale on both axes, so arcs keep their true shape:
 * the range that needs more points per unit decides the scale, the other axis gets slack.
 */
export function drawNyquist(doc: PDFKit.PDFDocument, box: Box, plots: ReportPlots): void {
  const { re, im } = plots.sample;
  const minusIm = im.map((v) => -v);
  const band = plots.referenceEnvelope ? nyquistBandPolygons(plots.referenceEnvelope) : [];
  const xs = finite([...re, ...band.flat().map((p) => p[0])]);
  const ys = finite([...minusIm, ...band.flat().map((p) => p[1])]);
  // Z′ of a liquid sits far from zero: centre the data rather than start the axis at 0, which
  // would shrink the arc to a corner of the plot.
  const xLo = Math.min(...xs);
  const xHi = Math.max(...xs);
  const yLo = Math.min(0, ...ys);
  const yHi = Math.max(...ys);
  const perPoint = Math.max((xHi - xLo || 1) / box.w, (yHi - yLo || 1) / box.h) * 1.08;
  const xMin = (xLo + xHi) / 2 - (perPoint * box.w) / 2;
  const xMax = xMin + perPoint * box.w;
  const yMin = yLo - perPoint * box.h * 0.03;
  const yMax = yMin + perPoint * box.h;
  const step = niceStep(0, Math.max(xMax - xMin, yMax - yMin), 5);
  const x = equalAxis(xMin, xMax, step, `Z′ / ${plots.impedanceUnit}`);
  const y = equalAxis(yMin, yMax, step, `−Z″ / ${plots.impedanceUnit}`);
  drawFrame(doc, box, x, y, 'Nyquist plot of the sample (equal axes)');
  clipped(doc, box, () => {
    if (band.length) {
      doc.save().fillColor(INK.tealLight);
      for (const hull of band) {
        polyline(doc, hull.map(([re0, negIm]) => [px(box, x, re0), py(box, y, negIm)]));
        doc.closePath();
      }
      doc.fill('nonzero').restore();
    }
    doc.save().lineWidth(1.1).strokeColor(INK.teal);
    polyline(doc, re.map((v, i) => [px(box, x, v), py(box, y, minusIm[i])]));
    doc.stroke().restore();
    doc.fillColor(INK.teal);
    re.forEach((v, i) => doc.circle(px(box, x, v), py(box, y, minusIm[i]), 1.3).fill());
  });
}

function equalAxis(min: number, max: number, step: number, label: string): Axis {
  const ticks: number[] = [];
  for (let t = Math.ceil(min / step) * step; t <= max; t += step) ticks.push(t);
  return { min, max, log: false, ticks, format: compact, label };
}

export const modulus = (re: number, im: number): number => Math.hypot(re, im);
export const phaseDeg = (re: number, im: number): number => (Math.atan2(im, re) * 180) / Math.PI;

/** Bode plot: |Z| (log) and phase against frequency (log), reference lots' spread shaded. */
export function drawBode(doc: PDFKit.PDFDocument, top: Box, bottom: Box, plots: ReportPlots, band: { min: number; max: number }): void {
  const { frequencyHz: f, re, im } = plots.sample;
  const env = plots.referenceEnvelope;
  const mod = re.map((v, i) => modulus(v, im[i]));
  const phase = re.map((v, i) => phaseDeg(v, im[i]));
  const fAll = finite([...f, band.min, band.max, ...(env?.frequencyHz ?? [])]);
  const fAxis = logAxis(Math.min(...fAll), Math.max(...fAll), 'frequency / Hz', compact);
  const modAll = finite([...mod, ...(env ? [...env.modulusMin, ...env.modulusMax] : [])]).filter((v) => v > 0);
  const modAxis = logAxis(Math.min(...modAll), Math.max(...modAll), `|Z| / ${plots.impedanceUnit}`, compact);
  const phAll = finite([...phase, ...(env ? [...env.phaseMinDeg, ...env.phaseMaxDeg] : [])]);
  const phAxis = linearAxis(Math.min(0, ...phAll), Math.max(0, ...phAll), 'phase / °', (v) => `${Math.round(v)}`, 4);

  drawFrame(doc, top, fAxis, modAxis, 'Bode plot: modulus');
  drawFrame(doc, bottom, fAxis, phAxis, 'Bode plot: phase');
  for (const [box, axis, values, lo, hi] of [
    [top, modAxis, mod, env?.modulusMin, env?.modulusMax],
    [bottom, phAxis, phase, env?.phaseMinDeg, env?.phaseMaxDeg],
  ] as Array<[Box, Axis, number[], number[] | undefined, number[] | undefined]>) {
    clipped(doc, box, () => {
      const x0 = px(box, fAxis, band.min);
      const x1 = px(box, fAxis, band.max);
      doc.save().fillColor(INK.panel).rect(x0, box.y, x1 - x0, box.h).fill().restore();
      if (env && lo && hi) {
        const upper = env.frequencyHz.map((fr, i): [number, number] => [px(box, fAxis, fr), py(box, axis, hi[i])]);
        const lower = env.frequencyHz.map((fr, i): [number, number] => [px(box, fAxis, fr), py(box, axis, lo[i])]).reverse();
        doc.save().fillColor(INK.tealLight);
        polyline(doc, [...upper, ...lower]);
        doc.closePath().fill().restore();
      }
      doc.save().lineWidth(1.1).strokeColor(INK.teal);
      polyline(doc, f.map((fr, i) => [px(box, fAxis, fr), py(box, axis, values[i])]));
      doc.stroke().restore();
    });
  }
}
