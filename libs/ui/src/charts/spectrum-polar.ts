/** |Z| in the unit of the parts. */
export function modulus(re: number, im: number): number {
  return Math.hypot(re, im);
}

/** Phase angle of Z in degrees, in (−180, 180]; negative for capacitive behaviour. */
export function phaseDeg(re: number, im: number): number {
  return (Math.atan2(im, re) * 180) / Math.PI;
}
