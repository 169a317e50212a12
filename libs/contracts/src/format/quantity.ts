/**
 * One number format for the portals and the PDF: a value (with or without its standard error) in
 * plain, scientific or engineering notation, returned both as runs to draw (normal, superscript,
 * subscript) and as plain text with real Unicode superscripts ("(6.76 ± 0.12) × 10⁻⁶ F").
 *
 * Rounding of a value with its standard error follows the usual rule (Review of Particle Physics,
 * "Rounding" in its introduction, in line with JCGM 100:2008 §7.2.6, which asks for at most two
 * significant digits of the uncertainty): the three leading digits of the SE decide —
 * 100–354: two significant digits; 355–949: one; 950–999: rounded up to 1000, kept as two.
 * The value is then rounded to the same decimal place as the SE. Notation follows NIST SP 811
 * (§7.9 and §10.5.3): a space before the unit, "× 10ⁿ" for powers of ten, a true minus sign.
 * Halves round away from zero on the exact binary value (ECMAScript toExponential's rule).
 */

export type QuantityPartRole = 'normal' | 'sup' | 'sub';

export interface QuantityPart {
  readonly text: string;
  readonly role: QuantityPartRole;
}

export type Notation = 'auto' | 'auto-scientific' | 'engineering' | 'scientific' | 'plain';

export interface QuantityOptions {
  /** Standard error of the value; null/undefined/not finite/≤ 0 = none, and `significant` applies. */
  readonly standardError?: number | null;
  /** Unit symbol, e.g. 'Ω', 'F', 'S·sⁿ'. Empty for a pure number. */
  readonly unit?: string;
  /**
   * 'auto' (default): plain between 10⁻³ and 10⁵, else engineering (with an SI prefix when the
   * unit takes one, else "× 10ⁿ"). 'auto-scientific': plain in the same range, else scientific
   * (for pure numbers such as χ²: 3.10 × 10⁻⁴). 'engineering': exponent a multiple of 3. 'scientific': one digit
   * before the point. 'plain': never a power of ten.
   */
  readonly notation?: Notation;
  /** Significant figures when no standard error is given. Default 4. */
  readonly significant?: number;
  /**
   * Whether the unit takes an SI prefix in engineering notation (µF rather than × 10⁻⁶ F).
   * Default: true for a simple unit symbol (letters and Ω only), false for a compound unit.
   */
  readonly prefixUnit?: boolean;
}

export interface Quantity {
  readonly negative: boolean;
  /** The value's digits as shown, without sign: "6.76". */
  readonly mantissa: string;
  /** The SE's digits at the same scale as the mantissa: "0.12"; null when there is none. */
  readonly uncertainty: string | null;
  /** Power of ten written as "× 10ⁿ" (0 = none written). */
  readonly exponent: number;
  /** SI prefix written before the unit ('' = none). */
  readonly prefix: string;
  readonly unit: string;
  /** Runs to draw in order. Superscripts carry the exponent, e.g. {text: '−6', role: 'sup'}. */
  readonly parts: readonly QuantityPart[];
  /** The same as one string, superscripts as Unicode characters. */
  readonly text: string;
}

const MINUS = '\u2212';
const SI_PREFIXES: Record<number, string> = {
  [-24]: 'y', [-21]: 'z', [-18]: 'a', [-15]: 'f', [-12]: 'p', [-9]: 'n', [-6]: 'µ', [-3]: 'm',
  0: '', 3: 'k', 6: 'M', 9: 'G', 12: 'T', 15: 'P', 18: 'E', 21: 'Z', 24: 'Y',
};
const SUPERSCRIPT: Record<string, string> = {
  '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', [MINUS]: '⁻', '+': '⁺',
};

/** A non-negative decimal N × 10^q held exactly as digits. */
export interface ScaledDecimal {
  readonly digits: string; // no leading zeros, "0" for zero
  readonly place: number; // q: power of ten of the last digit
}

/** Decimal exponent of |v| as ECMAScript writes it (exact, unlike Math.log10 near powers of ten). */
function exponentOf(v: number): number {
  return Number(Math.abs(v).toExponential().split('e')[1]);
}

/** |v| rounded to the decimal place `place`. */
function roundToPlace(v: number, place: number): ScaledDecimal {
  const a = Math.abs(v);
  if (a === 0) return { digits: '0', place };
  const e = exponentOf(a);
  const fraction = e - place;
  if (fraction < 0) {
    // |v| < 10^place: rounds to 0 or to one unit of the place
    return { digits: a / 10 ** place >= 0.5 ? '1' : '0', place };
  }
  if (fraction > 100) throw new RangeError(`cannot show ${v} to 10^${place}`);
  const [m, ex] = a.toExponential(fraction).split('e');
  let digits = m.replace('.', '');
  // 9.996 → "1.00e+1": the rounding carried into a new leading digit; the last place stays `place`.
  if (Number(ex) > e) digits += '0';
  return { digits, place };
}

function leadingExponent(s: ScaledDecimal): number {
  return s.digits === '0' ? Number.NEGATIVE_INFINITY : s.digits.length - 1 + s.place;
}

/** The digits of N × 10^q written at scale 10^shown: "6.76" for N=676, q=−8, shown=−6. */
function writeAt(s: ScaledDecimal, shown: number): string {
  const decimals = shown - s.place;
  if (decimals <= 0) return s.digits === '0' ? '0' : s.digits + '0'.repeat(-decimals);
  const padded = s.digits.padStart(decimals + 1, '0');
  return `${padded.slice(0, padded.length - decimals)}.${padded.slice(padded.length - decimals)}`;
}

/**
 * The decimal place of the last shown digit of a standard error and the SE rounded there,
 * by the 354/949 rule (see the file comment).
 */
export function roundStandardError(se: number): ScaledDecimal {
  const [m, ex] = se.toExponential(2).split('e');
  const lead = Number(m.replace('.', ''));
  const e = Number(ex);
  if (lead <= 354) return roundToPlace(se, e - 1);
  if (lead <= 949) return roundToPlace(se, e);
  return { digits: '10', place: e };
}

function simpleUnit(unit: string): boolean {
  return /^[A-Za-zΩ]+$/u.test(unit);
}

/** Digits, signs and the minus sign written as Unicode superscripts: '−6' → '⁻⁶'. */
export function superscriptText(text: string): string {
  return [...text].map((c) => SUPERSCRIPT[c] ?? c).join('');
}

/** Formats a value (and its standard error) in one notation for screens and reports alike. */
export function formatQuantity(value: number, options: QuantityOptions = {}): Quantity {
  const unit = options.unit ?? '';
  if (!Number.isFinite(value)) {
    const text = Number.isNaN(value) ? 'not a number' : value > 0 ? '∞' : `${MINUS}∞`;
    return { negative: value < 0, mantissa: text, uncertainty: null, exponent: 0, prefix: '', unit, parts: [{ text, role: 'normal' }], text };
  }
  const se = options.standardError;
  const hasSe = typeof se === 'number' && Number.isFinite(se) && se > 0;
  const significant = Math.min(Math.max(Math.round(options.significant ?? 4), 1), 17);

  let seScaled: ScaledDecimal | null = null;
  let place: number;
  if (hasSe) {
    seScaled = roundStandardError(se);
    place = seScaled.place;
  } else {
    place = value === 0 ? -(significant - 1) : exponentOf(value) - (significant - 1);
  }
  let valueScaled = roundToPlace(value, place);
  // A value rounded up into a new power of ten keeps `significant` digits, not one more.
  if (!hasSe && valueScaled.digits.length > significant && value !== 0) valueScaled = roundToPlace(value, place + 1);

  const magnitude = Math.max(leadingExponent(valueScaled), seScaled ? leadingExponent(seScaled) : Number.NEGATIVE_INFINITY);
  const lead = Number.isFinite(magnitude) ? magnitude : 0;
  const notation = options.notation ?? 'auto';
  const prefixable = unit !== '' && (options.prefixUnit ?? simpleUnit(unit));

  let shown = 0;
  let prefix = '';
  const plainFits = lead >= -3 && lead < 5;
  if (notation === 'scientific' || (notation === 'auto-scientific' && !plainFits)) shown = lead;
  else if (notation === 'engineering' || (notation === 'auto' && !plainFits)) {
    shown = Math.floor(lead / 3) * 3;
  }
  if (prefixable && shown !== 0 && SI_PREFIXES[shown] !== undefined && shown % 3 === 0 && notation !== 'scientific' && notation !== 'auto-scientific') {
    prefix = SI_PREFIXES[shown];
  }

  const mantissa = writeAt(valueScaled, shown);
  const uncertainty = seScaled ? writeAt(seScaled, shown) : null;
  const negative = value < 0 && valueScaled.digits !== '0';
  const signed = `${negative ? MINUS : ''}${mantissa}`;
  const exponent = prefix === '' ? shown : 0;
  const unitText = unit ? `${prefix}${unit}` : '';

  const core = uncertainty === null ? signed : `${signed} ± ${uncertainty}`;
  const parts: QuantityPart[] = [];
  if (exponent !== 0) {
    const expText = exponent < 0 ? `${MINUS}${-exponent}` : String(exponent);
    parts.push({ text: `${uncertainty === null ? core : `(${core})`} × 10`, role: 'normal' });
    parts.push({ text: expText, role: 'sup' });
    if (unitText) parts.push({ text: ` ${unitText}`, role: 'normal' });
  } else {
    parts.push({ text: unitText ? `${core} ${unitText}` : core, role: 'normal' });
  }
  // Units written with superscripts (S·sⁿ, Ω·cm²) stay as their characters; only the exponent is a run.
  const text = parts.map((p) => (p.role === 'sup' ? superscriptText(p.text) : p.text)).join('');
  return { negative, mantissa, uncertainty, exponent, prefix, unit, parts, text };
}

/** Shorthand: the plain-text rendering of `formatQuantity`. */
export function quantityText(value: number, options: QuantityOptions = {}): string {
  return formatQuantity(value, options).text;
}
