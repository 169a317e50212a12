import type { ColumnRole, FrequencyUnit, ImpedanceUnit, PhaseUnit } from './import-options';

/** A header cell read as a role and, when written, a unit and its scale to Hz, Ω or radians. */
export interface ColumnHeader {
  readonly role: ColumnRole;
  readonly unit: string | null;
  /** Multiplier to Hz, Ω or radians; null when the unit is absent. */
  readonly scale: number | null;
  /** The unit text when it was given but is not one this role accepts. */
  readonly badUnit?: string;
}

const FREQUENCY = new Set(['f', 'freq', 'frequency', 'frequenz', 'fréquence']);
const REAL = new Set(["z'", 'zre', 'zreal', 're(z)', 'rez', 'real', 're', 'zr', 'real(z)', 'z_re', 'zprime', "re(z')"]);
const IMAGINARY = new Set(["z''", 'zim', 'zimag', 'im(z)', 'imz', 'imag', 'imaginary', 'im', 'zi', 'imag(z)', 'z_im', 'zdoubleprime']);
const MODULUS = new Set(['|z|', 'zmod', 'mod(z)', 'modulus', 'magnitude', 'mag', 'abs(z)', '|impedance|', 'zabs', 'modz']);
const PHASE = new Set(['phase', 'phi', 'φ', 'θ', 'theta', 'zphz', 'phz', 'phase(z)', 'phaseangle', 'arg(z)', 'zphase', 'angle']);

export const FREQUENCY_SCALES: Readonly<Record<FrequencyUnit, number>> = { Hz: 1, kHz: 1e3, MHz: 1e6 };
export const IMPEDANCE_SCALES: Readonly<Record<ImpedanceUnit, number>> = { 'Ω': 1, 'kΩ': 1e3, 'MΩ': 1e6 };
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

/** Reads one header cell; null when the cell names nothing this importer uses. */
export function readColumnHeader(raw: string): ColumnHeader | null {
  const cell = plainText(raw.trim().replace(/^"(.*)"$/, '$1').trim());
  const { name, unit } = splitUnit(cell);
  let key = name.toLowerCase().replace(/[\s_.]+/g, '');
  let negative = false;
  if (key.startsWith('-')) {
    negative = true;
    key = key.slice(1);
  }
  key = key.replace(/"/g, "''");
  const withUnit = (role: ColumnRole, scaleOf: (u: string) => number | undefined): ColumnHeader => {
    if (unit === null || unit === '') return { role, unit: null, scale: null };
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
