// What the portals use from the charts; layouts stay internal apart from the input types.
export type { SpectrumSeries, ReferenceBand } from './chart-types';
export type { KkResiduals } from './kk-residual-layout';
export type { DistanceHistogramInput } from './histogram-layout';
export type { MapPoint } from './library-map-layout';
export { referenceEnvelope, type BandSpread } from './reference-envelope';
export { formatHz, formatOhm, formatNumber, formatSi } from './si-format';
export { BodeChart } from './bode-chart';
export { NyquistChart } from './nyquist-chart';
export { KkResidualChart } from './kk-residual-chart';
export { FitResidualChart } from './fit-residual-chart';
export { fitResiduals, type FittedCurve } from './fit-residuals';
export { DistanceHistogram } from './distance-histogram';
export { LibraryMap } from './library-map';
export { VerdictChip, VERDICT_LOOK, VERDICT_SHORT } from './verdict-chip';
export { SampleStateChip, SAMPLE_STATE_LOOK } from './sample-state-chip';
export { ScreeningCaution, SCREENING_CAUTION } from './screening-caution';
