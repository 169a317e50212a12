/**
 * An impedance spectrum: frequencies ascending in hertz, real and imaginary parts in ohms
 * (imaginary negative for capacitive behaviour), all the same length.
 */
export interface Spectrum {
  readonly frequencyHz: Float64Array;
  readonly re: Float64Array;
  readonly im: Float64Array;
}
