/**
 * Data the spectrum charts draw. Arrays are `ArrayLike<number>` so both the engine's
 * Float64Arrays and plain JSON arrays from the API can be passed without copying.
 */
export interface SpectrumSeries {
  readonly label: string;
  /** Ascending frequencies in hertz. */
  readonly frequencyHz: ArrayLike<number>;
  /** Real part Z′ in ohms (or Ω·cm once normalised; the chart only needs a consistent unit). */
  readonly re: ArrayLike<number>;
  /** Imaginary part Z″ in the same unit; negative for capacitive behaviour. */
  readonly im: ArrayLike<number>;
  /** Drawn faded and dashed: an excluded replicate stays visible but reads as set aside. */
  readonly muted?: boolean;
  /** A model's fitted curve is drawn as a plain line without markers, over the data. Default 'data'. */
  readonly role?: 'data' | 'fit';
}

/**
 * Spread of a reference library over its frequency grid. Modulus and phase bands are taken
 * lot by lot, not derived from the Z′/Z″ bands, because the envelope of |Z| is not a function
 * of the envelopes of its parts.
 */
export interface ReferenceBand {
  /** What the band shows, e.g. "Library v3, 5th–95th percentile". */
  readonly label: string;
  readonly frequencyHz: ArrayLike<number>;
  readonly reLow: ArrayLike<number>;
  readonly reHigh: ArrayLike<number>;
  readonly imLow: ArrayLike<number>;
  readonly imHigh: ArrayLike<number>;
  readonly modulusLow: ArrayLike<number>;
  readonly modulusHigh: ArrayLike<number>;
  readonly phaseLowDeg: ArrayLike<number>;
  readonly phaseHighDeg: ArrayLike<number>;
}

/** A tick on an axis: position in SVG units and its printed label (empty for minor ticks). */
export interface AxisTick {
  readonly position: number;
  readonly label: string;
  readonly major: boolean;
}

/** Plain rows for the "show as table" view of a chart. */
export interface ChartTable {
  readonly caption: string;
  readonly columns: readonly string[];
  readonly rows: readonly (readonly string[])[];
}

/** The drawable area inside an SVG: left/top offsets and size, all in viewBox units. */
export interface PlotArea {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}
