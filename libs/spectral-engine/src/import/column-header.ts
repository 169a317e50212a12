import type { ColumnRole, FrequencyUnit, ImpedanceUnit, PhaseUnit } from './import-options';

/** A header cell read as a role and, when written, a unit and its scale to Hz, Ω or radians. */
export interface ColumnHeader {
  readonly role: ColumnRole;
  readonly unit: string | null;
  /** Multiplier to Hz, Ω or radians; null when the unit is absent. */
  readonly scale: number | null;
  /** The unit text when it was given but is not one this role accepts. */
  readonly badUnit?: string;
  /** Why `badUnit` cannot be read, when it is a unit but an ambiguous one (e.g. 'mhz'). */
  readonly ambiguity?: string;
}

const FREQUENCY = new Set(['f', 'freq', 'frequency', 'frequenz', 'fréquence']);
// Names compared with spaces, underscores and dots removed: 'z_real' and 'Z real' both read 'zreal'.
const REAL = new Set(["z'", 'zre', 'zreal', 're(z)', 'rez', 'real', 're', 'zr', 'real(z)', 'zprime', "re(z')", 'realz', 'zreal', 'impedancereal', 'realimpedance']);
const IMAGINARY = new Set(["z''", 'zim', 'zimag', 'im(z)', 'imz', 'imag', 'imaginary', 'im', 'zi', 'imag(z)', 'zdoubleprime', 'imagz', 'zimaginary', 'impedanceimag', 'imaginaryimpedance']);
const MODULUS = new Set(['|z|', 'zmod', 'mod(z)', 'modulus', 'magnitude', 'mag', 'abs(z)', '|impedance|', 'zabs', 'modz', 'zmodulus', 'zmagnitude', 'absz', 'impedancemodulus', 'impedancemagnitude']);
const PHASE = new Set(['phase', 'phi', 'φ', 'θ', 'theta', 'zphz', 'phz', 'phase(z)', 'phaseangle', 'arg(z)', 'zphase', 'angle', 'zphi', 'zangle', 'impedancephase']);

export const FREQUENCY_SCALES: Readonly<Record<FrequencyUnit, number>> = { mHz: 1e-3, Hz: 1, kHz: 1e3, MHz: 1e6 };
export const IMPEDANCE_SCALES: Readonly<Record<ImpedanceUnit, number>> = { 'mΩ': 1e-3, 'Ω': 1, 'kΩ': 1e3, 'MΩ': 1e6 };
export const PHASE_SCALES: Readonly<Record<PhaseUnit, number>> = { deg: Math.PI / 180, rad: 1 };

/** Typographic primes and minus signs as plain ASCII, so Z′ and Z' read alike. */
export function plainText(text: string): string {
  return text
    .replace(/[\u2032\u2019\u00b4]/g, "'")
    .replace(/[\u2033\u201d]/g, "''")
    .replace(/[\u2212\u2013]/g, '-')
    .replace(/\u2126/g, 'Ω');
}

/**
 * Splits "Name (unit)", "Name [unit]" and "Name / unit". Plain index searches, no backtracking
 * regular expression, so a hostile header cannot make the import hang.
 */
function splitUnit(raw: string): { name: string; unit: string | null } {
  const cell = raw.trim();
  const close = cell.charAt(cell.length - 1);
  if (close === ')' || close === ']') {
    const open = cell.lastIndexOf(close === ')' ? '(' : '[');
    const name = open > 0 ? cell.slice(0, open).trim() : '';
    const inner = cell.slice(open + 1, -1).trim();
    // "Re(Z)" and "Phase(Z)" keep their brackets: what they enclose is the quantity, not a unit.
    if (name !== '' && !/^z'*$/i.test(inner)) return { name, unit: inner };
    return { name: cell, unit: null };
  }
  const slash = cell.lastIndexOf('/');
  if (slash > 0) return { name: cell.slice(0, slash).trim(), unit: cell.slice(slash + 1).trim() };
  return { name: cell, unit: null };
}

function frequencyScale(unit: string): number | undefined {
  if (unit === 'Hz' || unit.toLowerCase() === 'hz') return 1;
  if (unit.toLowerCase() === 'khz') return 1e3;
  // Case decides between mega- and millihertz.
  if (unit === 'MHz' || unit === 'MHZ') return 1e6;
  if (unit === 'mHz') return 1e-3;
  return undefined;
}

function impedanceScale(unit: string): number | undefined {
  const u = unit.replace(/\s+/g, '');
  const base = /^(ohms?|Ω|Ohms?|OHMS?)$/;
  if (base.test(u)) return 1;
  if (/^[kK]/.test(u) && base.test(u.slice(1))) return 1e3;
  if (/^M/.test(u) && base.test(u.slice(1))) return 1e6;
  if (/^m/.test(u) && base.test(u.slice(1))) return 1e-3;
  return undefined;
}

function phaseScale(unit: string): number | undefined {
  const u = unit.toLowerCase();
  if (u === '°' || u === 'deg' || u === 'degree' || u === 'degrees' || u === 'grad' || u === 'º') return Math.PI / 180;
  if (u === 'rad' || u === 'radian' || u === 'radians') return 1;
  return undefined;
}

/** Suffix units of snake-case headers ('freq_hz', 'z_real_kohm'), lower-case, and what they can mean. */
const SUFFIX_UNITS = new Set(['hz', 'khz', 'mhz', 'ohm', 'ohms', 'kohm', 'kohms', 'mohm', 'mohms', 'deg', 'degree', 'degrees', 'rad', 'radian', 'radians']);

/**
 * Splits a snake-case name with a unit suffix: 'freq_hz' → ('freq', 'hz'). Only when the last
 * underscore-separated word is a unit and what comes before it is a name on its own.
 */
function splitSuffixUnit(name: string): { name: string; unit: string } | null {
  const cut = name.lastIndexOf('_');
  if (cut <= 0 || cut === name.length - 1) return null;
  const unit = name.slice(cut + 1);
  if (!SUFFIX_UNITS.has(unit.toLowerCase())) return null;
  return { name: name.slice(0, cut), unit };
}

/**
 * A suffix unit written all in lower case cannot tell milli from mega ('mhz', 'mohm'): the header's
 * case is no signal when the whole header is lower case. Such a unit is ambiguous, not guessed.
 */
function suffixAmbiguity(unit: string): string | undefined {
  const u = unit.toLowerCase();
  if (unit !== u) return undefined;
  if (u === 'mhz') return "'mhz' could be millihertz or megahertz: write mHz or MHz";
  if (u === 'mohm' || u === 'mohms') return `'${unit}' could be milliohm or megaohm: write mOhm or MOhm`;
  return undefined;
}

/** A leading 'neg_' / 'minus_' (or 'neg ', 'minus-') marks −Z″ or −φ, as a leading '-' does. */
const NEGATION_PREFIX = /^(?:neg|minus)[_\s-]+/i;

/** Reads one header cell; null when the cell names nothing this importer uses. */
export function readColumnHeader(raw: string): ColumnHeader | null {
  const cell = plainText(raw.trim().replace(/^"(.*)"$/, '$1').trim());
  const split = splitUnit(cell);
  let name = split.name;
  let unit = split.unit;
  let negative = false;
  const prefix = NEGATION_PREFIX.exec(name);
  if (prefix) {
    negative = true;
    name = name.slice(prefix[0].length);
  }
  let ambiguity: string | undefined;
  if (unit === null) {
    const suffix = splitSuffixUnit(name);
    if (suffix) {
      name = suffix.name;
      unit = suffix.unit;
      ambiguity = suffixAmbiguity(suffix.unit);
    }
  }
  let key = name.toLowerCase().replace(/[\s_.]+/g, '');
  if (key.startsWith('-')) {
    if (negative) return null;
    negative = true;
    key = key.slice(1);
  }
  key = key.replace(/"/g, "''");
  const withUnit = (role: ColumnRole, scaleOf: (u: string) => number | undefined): ColumnHeader => {
    if (unit === null || unit === '') return { role, unit: null, scale: null };
    if (ambiguity) return { role, unit, scale: null, badUnit: unit, ambiguity };
    const scale = scaleOf(unit);
    return scale === undefined ? { role, unit, scale: null, badUnit: unit } : { role, unit, scale };
  };
  if (FREQUENCY.has(key) && !negative) return withUnit('frequency', frequencyScale);
  if (REAL.has(key) && !negative) return withUnit('real', impedanceScale);
  if (IMAGINARY.has(key)) return withUnit(negative ? 'negativeImaginary' : 'imaginary', impedanceScale);
  if (MODULUS.has(key) && !negative) return withUnit('modulus', impedanceScale);
  if (PHASE.has(key)) return withUnit(negative ? 'negativePhase' : 'phase', phaseScale);
  return null;
}
