import type { KramersKronigSummary, SpectrumPoints } from '@ohmprint/contracts';
import { linearKramersKronig } from '@ohmprint/spectral-engine';
import type { KkResiduals } from '@ohmprint/ui';

/**
 * The residuals behind a replicate's Kramers–Kronig summary, recomputed in the browser with the
 * same engine and the element count the API settled on, so the plot shows exactly what was judged.
 */
export function kkResiduals(spectrum: SpectrumPoints, summary: KramersKronigSummary): KkResiduals {
  const s = {
    frequencyHz: Float64Array.from(spectrum.frequencyHz),
    re: Float64Array.from(spectrum.re),
    im: Float64Array.from(spectrum.im),
  };
  const kk = linearKramersKronig(s, { elements: summary.elements, limitPct: summary.limitPercent });
  return { frequencyHz: s.frequencyHz, rePercent: kk.residualsRePct, imPercent: kk.residualsImPct, limitPercent: summary.limitPercent };
}
