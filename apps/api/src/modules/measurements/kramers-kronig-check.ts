import { linearKramersKronig, type Spectrum } from '@ohmprint/spectral-engine';
import type { KramersKronigSummary } from '@ohmprint/contracts';

/** The engine's linear Kramers–Kronig test of a measured sweep, against the lab's residual limit. */
export function kramersKronigCheck(s: Spectrum, limitPercent: number): KramersKronigSummary {
  const kk = linearKramersKronig(s, { limitPct: limitPercent });
  // A residual that is not a number cannot pass.
  return { passed: kk.passed && Number.isFinite(kk.maxAbsResidualPct), maxResidualPercent: kk.maxAbsResidualPct, elements: kk.elements, mu: kk.mu, limitPercent: kk.limitPct };
}
