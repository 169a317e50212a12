import type { Spectrum } from '../spectrum';
import { FREQUENCY_SCALES, IMPEDANCE_SCALES, PHASE_SCALES, plainText, readColumnHeader, type ColumnHeader } from './column-header';
import type { ColumnRole, ImportOptions } from './import-options';
import { readNumber } from './number-cell';
import { SpectrumImportError } from './spectrum-import-error';

const DELIMITERS = ['\t', ';', ','] as const;
const DELIMITER_NAMES: Record<string, string> = { '\t': 'tab', ';': 'semicolon', ',': 'comma' };
const SHAPE_HINT = "a frequency column and either Z′ and Z″ (or −Z″), or |Z| and phase, e.g. 'Frequency (Hz); Z' (Ω); Z'' (Ω)'";

interface Line {
  readonly number: number;
  readonly text: string;
}

interface Cell {
  readonly text: string;
  /** 1-based character position in the line. */
  readonly column: number;
}

interface Column {
  readonly index: number;
  readonly header: string;
  readonly scale: number;
}

type Layout =
  | { readonly kind: 'cartesian'; readonly frequency: Column; readonly real: Column; readonly imaginary: Column; readonly negated: boolean }
  | { readonly kind: 'polar'; readonly frequency: Column; readonly modulus: Column; readonly phase: Column; readonly negated: boolean };

/** More cells than this on one line is not an impedance export; stops hostile input early. */
const MAX_CELLS = 1000;

function splitCells(text: string, delimiter: string, line: number): Cell[] {
  const cells: Cell[] = [];
  let start = 0;
  for (;;) {
    if (cells.length === MAX_CELLS) {
      throw new SpectrumImportError(`more than ${MAX_CELLS} cells on one line: expected a few columns of numbers`, line);
    }
    const end = text.indexOf(delimiter, start);
    const raw = end === -1 ? text.slice(start) : text.slice(start, end);
    const lead = raw.length - raw.trimStart().length;
    cells.push({ text: raw.trim(), column: start + lead + 1 });
    if (end === -1) return cells;
    start = end + delimiter.length;
  }
}

function rejectBinary(text: string): void {
  const sample = text.slice(0, 4096);
  let control = 0;
  for (let i = 0; i < sample.length; i++) {
    const c = sample.charCodeAt(i);
    if (c === 0 || c === 0xfffd) {
      const line = text.slice(0, i).split(/\r\n|\r|\n/).length;
      throw new SpectrumImportError('this is a binary file, not a text export: expected lines of delimited numbers', line);
    }
    if (c < 32 && c !== 9 && c !== 10 && c !== 13) control++;
  }
  if (control > sample.length / 20) {
    throw new SpectrumImportError('this is a binary file, not a text export: expected lines of delimited numbers', 1);
  }
}

function isContent(line: Line): boolean {
  const t = line.text.trim();
  return t !== '' && !t.startsWith('#');
}

/** A run of consecutive numeric rows (blank and comment lines inside it neither break nor count). */
interface DataBlock {
  /** Index into `lines` of the run's first row. */
  readonly start: number;
  readonly rows: number;
}

/**
 * The longest run of rows that are all numbers when split at `delimiter`: where the data are,
 * however many metadata lines come before them. A line with more than MAX_CELLS cells is refused
 * here already.
 */
function longestDataBlock(lines: Line[], delimiter: string): DataBlock | null {
  const decimalComma = delimiter !== ',';
  let best: DataBlock | null = null;
  let start = -1;
  let count = 0;
  for (let i = 0; i <= lines.length; i++) {
    const line = lines[i];
    if (line && !isContent(line)) continue;
    let numeric = false;
    if (line && line.text.includes(delimiter)) numeric = isNumericRow(splitCells(line.text, delimiter, line.number), decimalComma);
    if (numeric) {
      if (count === 0) start = i;
      count++;
      continue;
    }
    if (count > 0 && (!best || count > best.rows)) best = { start, rows: count };
    count = 0;
  }
  return best;
}

/**
 * The cell separator, found from the data rows rather than from all lines: the separator that
 * gives the longest run of all-number rows (tab, then semicolon, then comma on a tie). Metadata
 * lines above the data, however many, do not take part in the vote.
 */
function chooseDelimiter(lines: Line[], options: ImportOptions): { delimiter: string; block: DataBlock | null } {
  if (options.delimiter) return { delimiter: options.delimiter, block: longestDataBlock(lines, options.delimiter) };
  let chosen: { delimiter: string; block: DataBlock } | null = null;
  for (const d of DELIMITERS) {
    const block = longestDataBlock(lines, d);
    if (block && (!chosen || block.rows > chosen.block.rows)) chosen = { delimiter: d, block };
  }
  if (chosen) return chosen;
  // No row of numbers under any separator: name the first line that starts like a data row, else the first line with text.
  const content = lines.filter(isContent);
  const dataLike = content.find((l) => /^[+\-\u2212]?\.?\d/.test(l.text.trim()));
  const at = dataLike ?? content[0];
  const hint = dataLike ? 'this line starts with a number but has no tab, semicolon or comma between its values' : 'no line holds numbers separated by tab, semicolon or comma';
  throw new SpectrumImportError(`no cell separator found: ${hint}; expected ${SHAPE_HINT}`, at?.number);
}

function isNumericRow(cells: Cell[], decimalComma: boolean): boolean {
  return cells.length >= 2 && cells.every((c) => c.text === '' || readNumber(c.text, decimalComma) !== null) && cells.some((c) => c.text !== '');
}

function columnName(role: ColumnRole): string {
  return {
    frequency: 'frequency',
    real: 'Z′',
    imaginary: 'Z″',
    negativeImaginary: '−Z″',
    modulus: '|Z|',
    phase: 'phase',
    negativePhase: '−phase',
  }[role];
}

/** Finds each role's column from the header and the caller's options, and checks their units. */
function layoutFrom(headerCells: Cell[] | null, headerLine: number | undefined, options: ImportOptions): Layout {
  const found = new Map<ColumnRole, { index: number; header: ColumnHeader | null; text: string; column?: number }>();
  headerCells?.forEach((cell, index) => {
    const h = readColumnHeader(cell.text);
    if (h && !found.has(h.role)) found.set(h.role, { index, header: h, text: cell.text, column: cell.column });
  });
  for (const [role, given] of Object.entries(options.columns ?? {}) as [ColumnRole, number | string][]) {
    let index: number;
    if (typeof given === 'number') {
      if (!Number.isInteger(given) || given < 1) throw new SpectrumImportError(`options.columns.${role} must be a column number from 1, got ${given}`);
      index = given - 1;
    } else {
      index = headerCells?.findIndex((c) => plainText(c.text.replace(/^"(.*)"$/, '$1')) === plainText(given)) ?? -1;
      if (index < 0) throw new SpectrumImportError(`options.columns.${role} names column '${given}', which the header does not have`, headerLine);
    }
    const cell = headerCells?.[index];
    const header = cell ? readColumnHeader(cell.text) : null;
    found.set(role, { index, header: header && header.role === role ? header : header ? { ...header, role } : null, text: cell?.text ?? `column ${index + 1}`, column: cell?.column });
  }

  const column = (role: ColumnRole, kind: 'frequency' | 'impedance' | 'phase'): Column => {
    const f = found.get(role)!;
    const optionUnit = options.units?.[kind];
    let scale: number | null | undefined = f.header?.scale;
    if (optionUnit) {
      scale = kind === 'frequency' ? FREQUENCY_SCALES[optionUnit as keyof typeof FREQUENCY_SCALES] : kind === 'impedance' ? IMPEDANCE_SCALES[optionUnit as keyof typeof IMPEDANCE_SCALES] : PHASE_SCALES[optionUnit as keyof typeof PHASE_SCALES];
      if (scale === undefined) throw new SpectrumImportError(`options.units.${kind} '${optionUnit}' is not a unit this importer knows`);
    }
    if (scale === null || scale === undefined) {
      const expected = { frequency: 'Hz, kHz or MHz', impedance: 'Ω, kΩ or MΩ (also written Ohm, kOhm, MOhm)', phase: '° (deg) or rad' }[kind];
      const what = f.header?.ambiguity
        ? `gives an ambiguous unit: ${f.header.ambiguity} in the header, or give options.units.${kind}`
        : f.header?.badUnit
          ? `gives unit '${f.header.badUnit}', which is not one of ${expected}`
          : `names no unit: expected ${expected} in brackets in the header (or as a suffix such as '_hz', '_ohm', '_deg'), or options.units.${kind}`;
      throw new SpectrumImportError(`column '${f.text}' (${columnName(role)}) ${what}`, headerLine, f.column);
    }
    return { index: f.index, header: f.text, scale };
  };

  if (!found.has('frequency')) {
    throw new SpectrumImportError(`no frequency column: expected ${SHAPE_HINT}`, headerLine);
  }
  const imaginary = found.has('imaginary') ? 'imaginary' : found.has('negativeImaginary') ? 'negativeImaginary' : null;
  if (found.has('real') && imaginary) {
    return {
      kind: 'cartesian',
      frequency: column('frequency', 'frequency'),
      real: column('real', 'impedance'),
      imaginary: column(imaginary, 'impedance'),
      negated: imaginary === 'negativeImaginary',
    };
  }
  const phase = found.has('phase') ? 'phase' : found.has('negativePhase') ? 'negativePhase' : null;
  if (found.has('modulus') && phase) {
    return {
      kind: 'polar',
      frequency: column('frequency', 'frequency'),
      modulus: column('modulus', 'impedance'),
      phase: column(phase, 'phase'),
      negated: phase === 'negativePhase',
    };
  }
  const have = [...found.keys()].map(columnName).join(', ');
  throw new SpectrumImportError(`the columns found (${have}) do not make a spectrum: expected ${SHAPE_HINT}`, headerLine);
}

function hasExplicitLayout(options: ImportOptions): boolean {
  const c = options.columns ?? {};
  const byNumber = (r: ColumnRole) => typeof c[r] === 'number';
  return byNumber('frequency') && ((byNumber('real') && (byNumber('imaginary') || byNumber('negativeImaginary'))) || (byNumber('modulus') && (byNumber('phase') || byNumber('negativePhase'))));
}

/**
 * Reads an instrument's text export into a spectrum (frequencies in Hz ascending, impedance in Ω).
 *
 * Accepts (f, Z′, Z″), (f, Z′, −Z″) and (f, |Z|, phase in degrees or radians); units Hz/kHz/MHz
 * and Ω/kΩ/MΩ from the header; tab, semicolon or comma between cells; decimal commas when commas
 * do not separate cells; metadata lines before the header; rows in any order; CRLF; a byte-order
 * mark. Columns other than these are ignored.
 * @throws SpectrumImportError naming the line (and column) and what was expected; nothing is guessed
 */
export function parseSpectrumFile(text: string, options: ImportOptions = {}): Spectrum {
  if (typeof text !== 'string') throw new SpectrumImportError('expected the file as text');
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') throw new SpectrumImportError('the file is empty: expected a header row and rows of numbers');
  rejectBinary(body);
  const minPoints = options.minPoints ?? 5;
  const lines: Line[] = body.split(/\r\n|\r|\n/).map((t, i) => ({ number: i + 1, text: t }));
  const { delimiter, block } = chooseDelimiter(lines, options);
  const decimalComma = delimiter !== ',';

  let cursor = 0;
  let headerCells: Cell[] | null = null;
  let headerLine: number | undefined;
  const explicit = hasExplicitLayout(options);
  const namedColumns = Object.values(options.columns ?? {}).filter((c): c is string => typeof c === 'string').map(plainText);
  const isHeaderRow = (cells: Cell[]): boolean => {
    const texts = cells.map((c) => plainText(c.text.replace(/^"(.*)"$/, '$1')));
    const recognised = cells.map((c) => readColumnHeader(c.text)).filter((h) => h !== null);
    const namesGiven = namedColumns.length > 0 && namedColumns.every((n) => texts.includes(n));
    return namesGiven || (recognised.some((h) => h.role === 'frequency') && recognised.length >= 2);
  };
  // The header is the nearest line above the data block that names the columns; everything above
  // it (instrument, operator, settings…) is metadata, however long.
  const blockStart = block ? block.start : lines.length;
  let lastText: Line | undefined;
  for (let i = blockStart - 1; i >= 0; i--) {
    const line = lines[i];
    if (!isContent(line)) continue;
    const cells = splitCells(line.text, delimiter, line.number);
    if (isHeaderRow(cells)) {
      headerCells = cells;
      headerLine = line.number;
      cursor = i + 1;
      break;
    }
    lastText ??= line;
  }
  if (!headerCells) {
    if (!explicit) {
      if (!block) throw new SpectrumImportError(`no header row found: expected ${SHAPE_HINT}`);
      if (lastText) {
        throw new SpectrumImportError(
          `no header row found: the line above the numbers does not name the columns; expected ${SHAPE_HINT}, or options.columns`,
          lastText.number,
        );
      }
      throw new SpectrumImportError(`numbers before any header row: expected a header naming the columns first (${SHAPE_HINT}), or options.columns`, lines[blockStart].number);
    }
    // Columns given by number and no header: the data start at the first row of numbers.
    cursor = lines.findIndex((l) => isContent(l) && isNumericRow(splitCells(l.text, delimiter, l.number), decimalComma));
    if (cursor < 0) cursor = lines.length;
  }
  const layout = layoutFrom(headerCells, headerLine, options);
  const used = layout.kind === 'cartesian' ? [layout.frequency, layout.real, layout.imaginary] : [layout.frequency, layout.modulus, layout.phase];
  const needed = Math.max(...used.map((c) => c.index)) + 1;

  const rows: { f: number; re: number; im: number; line: number }[] = [];
  for (; cursor < lines.length; cursor++) {
    const line = lines[cursor];
    if (!isContent(line)) continue;
    const cells = splitCells(line.text, delimiter, line.number);
    if (cells.length < needed) {
      throw new SpectrumImportError(
        `too few columns: expected at least ${needed} separated by ${DELIMITER_NAMES[delimiter]}, found ${cells.length}`,
        line.number,
      );
    }
    const value = (c: Column): number => {
      const cell = cells[c.index];
      const v = readNumber(cell.text, decimalComma);
      if (v === null) {
        const shown = cell.text === '' ? 'an empty cell' : `'${cell.text.length > 40 ? `${cell.text.slice(0, 40)}…` : cell.text}'`;
        throw new SpectrumImportError(`expected a number for '${c.header}', found ${shown}`, line.number, cell.column);
      }
      return v * c.scale;
    };
    const f = value(layout.frequency);
    if (!(f > 0)) {
      throw new SpectrumImportError(`frequency must be positive, found ${cells[layout.frequency.index].text}`, line.number, cells[layout.frequency.index].column);
    }
    if (layout.kind === 'cartesian') {
      const im = value(layout.imaginary);
      rows.push({ f, re: value(layout.real), im: layout.negated ? -im : im, line: line.number });
    } else {
      const modulus = value(layout.modulus);
      const phase = (layout.negated ? -1 : 1) * value(layout.phase);
      if (modulus < 0) throw new SpectrumImportError(`|Z| cannot be negative, found ${cells[layout.modulus.index].text}`, line.number, cells[layout.modulus.index].column);
      rows.push({ f, re: modulus * Math.cos(phase), im: modulus * Math.sin(phase), line: line.number });
    }
  }
  if (rows.length < minPoints) {
    throw new SpectrumImportError(`only ${rows.length} data row${rows.length === 1 ? '' : 's'}: expected at least ${minPoints} frequencies`, lines.length);
  }
  rows.sort((a, b) => a.f - b.f || a.line - b.line);
  for (let i = 1; i < rows.length; i++) {
    if (rows[i].f === rows[i - 1].f) {
      const [first, second] = [rows[i - 1].line, rows[i].line].sort((a, b) => a - b);
      throw new SpectrumImportError(`frequency ${rows[i].f} Hz appears twice (also on line ${first}): expected each frequency once`, second, cellColumn(lines[second - 1], delimiter, layout.frequency.index));
    }
  }
  return {
    frequencyHz: Float64Array.from(rows, (r) => r.f),
    re: Float64Array.from(rows, (r) => r.re),
    im: Float64Array.from(rows, (r) => r.im),
  };
}

function cellColumn(line: Line, delimiter: string, index: number): number {
  return splitCells(line.text, delimiter, line.number)[index].column;
}
