import type { ReferenceBandPoints } from '@ohmprint/contracts';
import type { ReportPlots } from '../reports/pdf/report-data';

/** The report's |Z|, phase, Z′ and Z″ envelope from the band stored with the library version (null without lots). */
export function envelopeOfBand(band: ReferenceBandPoints | null): ReportPlots['referenceEnvelope'] {
  if (!band || band.lotCount === 0) return null;
  return {
    frequencyHz: band.frequencyHz,
    modulusMin: band.modulusLow,
    modulusMax: band.modulusHigh,
    phaseMinDeg: band.phaseLowDeg,
    phaseMaxDeg: band.phaseHighDeg,
    reMin: band.reLow,
    reMax: band.reHigh,
    imMin: band.imLow,
    imMax: band.imHigh,
  };
}
