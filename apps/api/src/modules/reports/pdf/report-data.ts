/**
 * Everything a test report shows, as plain serialisable data (dates as ISO 8601 strings) so the
 * issuance service can store it beside the PDF and re-render it for an amendment.
 * The analyses feature maps an approved analysis onto `ReportContent`; issuance adds the rest.
 */
export type ReportVerdict = 'consistent' | 'inconclusive' | 'not-consistent' | 'no-verdict';

export interface ReportLab {
  name: string;
  /** Postal address, one line per entry. */
  address: string[];
  /** Where the tests were carried out when it differs from the address above. */
  siteOfTesting?: string | null;
  accreditation: { body: string; number: string } | null;
  contactEmail?: string | null;
}

export interface ReportClient {
  name: string;
  contactName: string;
  contactEmail: string;
  address?: string[];
}

export interface ReportSample {
  code: string;
  productName: string;
  /** The product's matrix as the client registered it, e.g. "red wine". */
  matrix: string;
  claimedLot: string | null;
  obtainedWhere: string | null;
  /** ISO date (YYYY-MM-DD) the client obtained the item. */
  obtainedOn: string | null;
  labelText: string | null;
  /** ISO timestamp of receipt at the lab. */
  receivedAt: string;
  conditionOnReceipt: string;
}

export interface ReportMethod {
  name: string;
  /** The lab's method and its version number the library was built under (absent on older reports or libraries built before methods had versions). */
  methodVersion?: { name: string; version: number } | null;
  bandHz: { min: number; max: number };
  gridPoints: number;
  referenceTemperatureC: number;
  /** Linear temperature coefficient as a fraction per °C (0.02 = 2 %/°C). */
  temperatureCoefficientPerC: number;
  modelName: string;
  /** Calibration quantiles behind T95 and T99 as fractions, e.g. 0.95 and 0.99. */
  quantiles: { lower: number; upper: number };
  library: { productName: string; version: string; lotCount: number; publishedAt: string };
  engineVersion: string;
  replicateCount: number;
  /** Departures from the documented method; empty when there were none. */
  deviations: string[];
  /** How the library's thresholds were estimated and how sure they are (absent on reports issued before it was stated). */
  thresholds?: ReportThresholds | null;
  /** Each replicate's measurement temperature and where it came from (absent in reports issued before it was recorded). */
  measurementTemperatures?: MeasurementTemperature[];
}

export interface ReportThresholds {
  /** Plain words, e.g. "lognormal fitted by maximum likelihood". */
  estimator: string;
  lotCount: number;
  t95Interval: [number, number] | null;
  t99Interval: [number, number] | null;
  /** Coverage of the intervals (0.95) and the bootstrap resamples behind them. */
  confidenceLevel: number | null;
  resamples: number | null;
}

export interface MeasurementTemperature {
  replicateNumber: number;
  fileName: string;
  temperatureC: number;
  /** `file`: stated by the export; `entered`: typed (the export states none); `entered-over-file`: typed over the export's, with a reason. */
  source: 'file' | 'entered' | 'entered-over-file';
}

/** The revoked report a re-analysis follows. */
export interface FollowedReport {
  reportNumber: string;
  reason: string;
  revokedAt: string;
}

export interface FittedParameter {
  name: string;
  /** Printed in place of the name when the model's catalog gives one ("Relaxation time τ"). */
  description?: string;
  value: number;
  standardError: number | null;
  unit: string;
}

export interface QualityFlag {
  severity: 'info' | 'warning';
  message: string;
}

export interface ReportResults {
  verdict: ReportVerdict;
  /** Normalised Canberra distance (0–1) from the sample to its nearest reference lot. */
  nearestDistance: number | null;
  nearestLot: string | null;
  /** The producer's own code of the nearest lot, from its reference-lot declaration (absent on older reports or when none was declared). */
  nearestLotProducerCode?: string | null;
  /**
   * The lot claimed for the item and whether the nearest lot is that lot (by the producer's code;
   * null when the nearest lot has none). Null or absent when no lot was claimed.
   */
  claimedLotCheck?: { lotCode: string; nearestIsClaimed: boolean | null } | null;
  t95: number | null;
  t99: number | null;
  /** Share (0–1) of calibration distances above the sample's nearest distance. */
  typicality: number | null;
  fittedParameters: FittedParameter[];
  goodnessOfFit: number | null;
  /** How χ² weighed the residuals, in words ("modulus weighting"); absent on older reports. */
  fitWeighting?: string | null;
  qualityFlags: QualityFlag[];
}

export interface PlotSpectrum {
  frequencyHz: number[];
  re: number[];
  im: number[];
}

export interface ReportPlots {
  /** Unit of the plotted impedance, e.g. "Ω·cm" for specific impedance. */
  impedanceUnit: string;
  /** The sample's averaged, normalised spectrum on the method grid. */
  sample: PlotSpectrum;
  /** Spread of the reference lots on the same grid (min and max of |Z| and phase in degrees). */
  referenceEnvelope: {
    frequencyHz: number[];
    modulusMin: number[];
    modulusMax: number[];
    phaseMinDeg: number[];
    phaseMaxDeg: number[];
    /** Spread of Z′ and Z″ per frequency, for the Nyquist band (absent on reports issued before it was stored). */
    reMin?: number[];
    reMax?: number[];
    imMin?: number[];
    imMax?: number[];
  } | null;
  /**
   * The reference lots' leave-one-out distances as the analysis binned them (equal bins from 0);
   * a report keeps these bins, not every lot's distance.
   */
  calibrationHistogram?: { binEdges: number[]; counts: number[] };
  /** Every lot's leave-one-out distance: only on reports issued before they kept bins. */
  calibrationDistances?: number[];
  /** 2-D map (classical MDS) of the reference lots and the sample. */
  map: { lots: { label: string; x: number; y: number }[]; sample: { x: number; y: number } } | null;
}

export interface ReportPerson {
  name: string;
  role: string;
}

/** What the caller supplies when a report is issued. */
export interface ReportContent {
  lab: ReportLab;
  client: ReportClient;
  sample: ReportSample;
  method: ReportMethod;
  results: ReportResults;
  plots: ReportPlots;
  /** ISO dates of the first and last measurement. */
  testedFrom: string;
  testedTo: string;
  analyst: ReportPerson;
  authorisedBy: ReportPerson;
  remarks: string | null;
  /** Set when the sample's earlier report was revoked and this one follows it. */
  follows?: FollowedReport | null;
  /** Invented demo data: every page then says so in its header. */
  demo?: boolean;
}

/** What the renderer needs: the content plus the identity issuance gives it. */
export interface ReportData extends ReportContent {
  reportNumber: string;
  issuedAt: string;
  /** Set on an amended report: the report it replaces and why. */
  replaces: { reportNumber: string; reason: string } | null;
  verification: { code: string; url: string };
}
