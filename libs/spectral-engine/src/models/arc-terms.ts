/**
 * One point of a depressed arc, D = 1 + k·(jx)ⁿ: the pieces every partial derivative of ZARC
 * and Cole–Cole is built from. Reused across points (filled in place) so the fitting loop does
 * not allocate per frequency.
 */
export interface ArcPoint {
  /** ln x, where x is ω (ZARC) or ωτ (Cole–Cole). */
  logX: number;
  /** (jx)ⁿ, without the factor k. */
  unitRe: number;
  unitIm: number;
  /** 1/D */
  invRe: number;
  invIm: number;
  /** 1/D² */
  inv2Re: number;
  inv2Im: number;
  /** (D − 1)/D², the common factor of the derivatives by k's parts and by n. */
  riseRe: number;
  riseIm: number;
}

/** Fills an `ArcPoint` for each ω (x = ω·xScale) and hands it to `visit` with the point's index. */
export function forEachArcPoint(
  omega: Float64Array,
  xScale: number,
  k: number,
  n: number,
  visit: (i: number, t: Readonly<ArcPoint>) => void,
): void {
  const c = Math.cos((n * Math.PI) / 2);
  const sn = Math.sin((n * Math.PI) / 2);
  const t: ArcPoint = { logX: 0, unitRe: 0, unitIm: 0, invRe: 0, invIm: 0, inv2Re: 0, inv2Im: 0, riseRe: 0, riseIm: 0 };
  for (let i = 0; i < omega.length; i++) {
    t.logX = Math.log(omega[i] * xScale);
    const m = Math.exp(n * t.logX);
    t.unitRe = m * c;
    t.unitIm = m * sn;
    const eRe = k * t.unitRe;
    const eIm = k * t.unitIm;
    const dr = 1 + eRe;
    const mod2 = dr * dr + eIm * eIm;
    t.invRe = dr / mod2;
    t.invIm = -eIm / mod2;
    t.inv2Re = t.invRe * t.invRe - t.invIm * t.invIm;
    t.inv2Im = 2 * t.invRe * t.invIm;
    t.riseRe = eRe * t.inv2Re - eIm * t.inv2Im;
    t.riseIm = eRe * t.inv2Im + eIm * t.inv2Re;
    visit(i, t);
  }
}

/**
 * Writes scale·z·(ln x + jπ/2) at `index`: the derivative of (jx)ⁿ by n is (jx)ⁿ·(ln x + jπ/2),
 * so every exponent derivative (CPE, ZARC, Cole–Cole) ends in this product.
 */
export function putExponentTerm(
  dRe: Float64Array,
  dIm: Float64Array,
  index: number,
  scale: number,
  zRe: number,
  zIm: number,
  logX: number,
): void {
  dRe[index] = scale * (zRe * logX - zIm * (Math.PI / 2));
  dIm[index] = scale * (zRe * (Math.PI / 2) + zIm * logX);
}
