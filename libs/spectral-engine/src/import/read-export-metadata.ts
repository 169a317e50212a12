/**
 * What an instrument export says about itself: the sample it names (in its file name and in the
 * metadata lines before the data), the measurement temperature with its unit, the instrument and
 * the date and time. Only what a line states is read — a temperature without a unit, a date in an
 * order that could be read two ways or a code that does not fit the lab's pattern is never
 * completed by a guess; the first two are listed in `notes` instead.
 */

/** Where a value was read: 1-based line number of the export. */
export interface StatedText {
  /** The value as the line writes it (trimmed). */
  text: string;
  line: number;
}

export interface StatedSample extends StatedText {
  /** Codes of the lab's pattern inside the value, upper case (empty when it names none). */
  codes: string[];
}

export type TemperatureUnit = 'degC' | 'K' | 'degF';

export interface StatedTemperature extends StatedText {
  /** The number as written, in `unit`. */
  value: number;
  unit: TemperatureUnit;
  /** The same temperature in °C. */
  celsius: number;
}

export interface StatedDateTime extends StatedText {
  /**
   * ISO 8601 local date-time (`YYYY-MM-DDTHH:MM:SS`, or `YYYY-MM-DD` alone) with the offset only
   * when the file states one; null when the text is not in an unambiguous year-first form.
   */
  iso: string | null;
}

export interface ExportMetadata {
  /** Sample codes of the lab's pattern in the file name, upper case, in order of appearance. */
  fileNameCodes: string[];
  /** The first metadata line naming a sample. */
  sample: StatedSample | null;
  temperature: StatedTemperature | null;
  instrument: StatedText | null;
  measuredAt: StatedDateTime | null;
  /** Lines that looked like a statement but could not be read without guessing. */
  notes: { line: number; message: string }[];
}

export interface ReadExportMetadataOptions {
  /**
   * The lab's sample-code format, e.g. `/OP-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{2}/`. Anchors
   * are ignored; a match must not touch another letter or digit, and case is ignored. Without a
   * pattern no code is read (the sample value is still returned as written).
   */
  codePattern?: RegExp;
  /** Lines looked at before giving up on finding the data block (default 2000). */
  maxLines?: number;
}

/** K → °C: t/°C = T/K − 273.15 (SI Brochure, 9th edition, 2.3.1: definition of the degree Celsius). */
const KELVIN_OFFSET = 273.15;
/** °F → °C: t/°C = (t/°F − 32) × 5/9 (NIST SP 811, 2008, B.9: exact by definition). */
const fahrenheitToCelsius = (f: number) => ((f - 32) * 5) / 9;
/** Conversions in binary floating point leave noise such as 19.999999999999996; 1e-9 °C is far below any thermometer. */
const roundCelsius = (c: number) => Math.round(c * 1e9) / 1e9;

const SAMPLE_KEYS = new Set([
  'sample', 'sample id', 'sample code', 'sample name', 'sample no', 'sample number', 'sample ref',
  'sample reference', 'sample label', 'specimen', 'specimen id', 'specimen name',
]);
const TEMPERATURE_KEYS = new Set([
  'temperature', 'temp', 'sample temperature', 'sample temp', 'measurement temperature', 'measuring temperature',
  'cell temperature', 'solution temperature', 'liquid temperature',
]);
const INSTRUMENT_KEYS = new Set([
  'instrument', 'instrument name', 'instrument model', 'instrument id', 'device', 'device name', 'analyser',
  'analyzer', 'impedance analyser', 'impedance analyzer', 'potentiostat',
]);
const DATE_KEYS = new Set(['date', 'measurement date', 'measured on', 'acquisition date', 'test date', 'run date', 'date measured']);
const TIME_KEYS = new Set(['time', 'measurement time', 'start time', 'acquisition time', 'time of day']);
const DATETIME_KEYS = new Set([
  'date time', 'datetime', 'date and time', 'timestamp', 'measured at', 'measured', 'acquired', 'acquired at',
  'recorded', 'recorded at', 'started', 'started at', 'start', 'measurement started',
]);

const UNIT_WORDS: Record<string, TemperatureUnit> = {
  c: 'degC', degc: 'degC', 'deg c': 'degC', '°c': 'degC', 'º c': 'degC', 'ºc': 'degC', '° c': 'degC', '℃': 'degC', celsius: 'degC',
  k: 'K', kelvin: 'K',
  f: 'degF', degf: 'degF', 'deg f': 'degF', '°f': 'degF', '° f': 'degF', 'ºf': 'degF', 'º f': 'degF', '℉': 'degF', fahrenheit: 'degF',
};
const unitOf = (word: string): TemperatureUnit | undefined => UNIT_WORDS[word.trim().toLowerCase().replace(/\s+/g, ' ')];

const COMMENT_MARK = /^\s*(?:#+|;+|%+|!+|\/\/+|\*+|rem\s)\s*/i;
const NUMBER = /^[+\-\u2212]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?$/;

function toNumber(text: string): number | null {
  const t = text.trim().replace(/^\u2212/, '-');
  if (!NUMBER.test(t)) return null;
  const value = Number(t.includes('.') ? t : t.replace(',', '.'));
  return Number.isFinite(value) ? value : null;
}

/** A numeric data row: at least two cells, every one a number (decimal point or comma). */
function isDataRow(line: string): boolean {
  const t = line.trim();
  if (!t || COMMENT_MARK.test(t)) return false;
  return [/\t/, /;/, /,/, /\s+/].some((sep) => {
    const cells = t.split(sep).map((c) => c.trim().replace(/^"(.*)"$/, '$1'));
    return cells.length >= 2 && cells.every((c) => toNumber(c) !== null);
  });
}

/** "SampleID" → "sample id", "temp_c" → "temp c", "Temperature (°C)" → key "temperature" and unit °C. */
function normaliseKey(raw: string): { key: string; unit: TemperatureUnit | undefined } {
  let unit: TemperatureUnit | undefined;
  const bare = raw
    .replace(/[([]\s*([^)\]]*)\s*[)\]]/g, (_m, inside: string) => {
      unit ??= unitOf(inside);
      return ' ';
    })
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .toLowerCase()
    .replace(/[_\-./]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  const words = bare.split(' ');
  if (words.length > 1) {
    const suffix = unitOf(words[words.length - 1]);
    if (suffix) return { key: words.slice(0, -1).join(' '), unit: unit ?? suffix };
  }
  return { key: bare, unit };
}

const PAIR = /^[A-Za-z][^:=]*[:=]/;

/**
 * "Sample: A Replicate: 1" written with single spaces: a new statement starts at a word followed by
 * a colon, after the first statement's colon. The new key is that one word (a longer key cannot
 * be told from the end of the value before it); times such as 14:05 start with a digit and stay.
 */
function splitSingleSpaced(segment: string): string[] {
  const parts: string[] = [];
  let rest = segment;
  for (;;) {
    const first = rest.search(/[:=]/);
    if (first < 0) break;
    const next = /\s([A-Za-z][^\s:=]*)\s*[:=]\s/.exec(rest.slice(first + 1));
    if (!next) break;
    const at = first + 1 + next.index;
    parts.push(rest.slice(0, at));
    rest = rest.slice(at + 1);
  }
  return [...parts, rest];
}

/** The (key, value) statements of one metadata line; several may share a line ("Sample: A  Temperature: 20 C"). */
function statements(line: string): { rawKey: string; value: string }[] {
  const body = line.replace(COMMENT_MARK, '').trim();
  if (!body) return [];
  const segments = body
    .split(/\t|\s{2,}|\s*[;|]\s*/)
    .map((s) => s.trim())
    .filter(Boolean);
  const paired = segments.filter((s) => PAIR.test(s)).flatMap(splitSingleSpaced);
  if (paired.length) {
    return paired.map((s) => {
      const at = s.search(/[:=]/);
      return { rawKey: s.slice(0, at), value: s.slice(at + 1).trim().replace(/[,;]$/, '').trim().replace(/^"(.*)"$/, '$1') };
    });
  }
  // "Temperature,25.0,°C", "Time<tab>14:05:09" or "Sample ID;OP-…": a key cell followed by its value cells.
  const cells = (segments.length > 1 ? segments : body.split(',')).map((c) => c.trim().replace(/^"(.*)"$/, '$1'));
  return cells.length >= 2 && cells.length <= 3 ? [{ rawKey: cells[0], value: cells.slice(1).join(' ').trim() }] : [];
}

const TEMPERATURE_VALUE = /^([+\-\u2212]?(?:\d+(?:[.,]\d+)?|[.,]\d+))\s*(.*)$/;

function readTemperature(value: string, keyUnit: TemperatureUnit | undefined, line: number, notes: ExportMetadata['notes']): StatedTemperature | null {
  const m = TEMPERATURE_VALUE.exec(value.trim());
  const number = m ? toNumber(m[1]) : null;
  if (!m || number === null) {
    notes.push({ line, message: `the temperature "${value}" is not a number` });
    return null;
  }
  const written = m[2].trim();
  const valueUnit = written ? unitOf(written) : undefined;
  if (written && !valueUnit) {
    notes.push({ line, message: `the temperature unit "${written}" is not one of °C, K or °F` });
    return null;
  }
  if (valueUnit && keyUnit && valueUnit !== keyUnit) {
    notes.push({ line, message: 'the temperature line states two different units' });
    return null;
  }
  const unit = valueUnit ?? keyUnit;
  if (!unit) {
    notes.push({ line, message: `the temperature ${m[1]} is given without a unit, so it is not used` });
    return null;
  }
  const celsius = unit === 'degC' ? number : unit === 'K' ? number - KELVIN_OFFSET : fahrenheitToCelsius(number);
  return { text: value.trim(), line, value: number, unit, celsius: roundCelsius(celsius) };
}

const ISO_DATE = /^(\d{4})[-/](\d{2})[-/](\d{2})$/;
const ISO_TIME = /^(\d{2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i;
const ISO_DATE_TIME = /^(\d{4})[-/](\d{2})[-/](\d{2})(?:[T ]|\s+)(\d{2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i;

function validDate(y: string, mo: string, d: string): boolean {
  const date = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d)));
  return date.getUTCFullYear() === Number(y) && date.getUTCMonth() === Number(mo) - 1 && date.getUTCDate() === Number(d);
}

function validTime(h: string, mi: string, s: string | undefined): boolean {
  return Number(h) < 24 && Number(mi) < 60 && (s === undefined || Number(s) < 60);
}

const offsetOf = (z: string | undefined) => (!z ? '' : z.toUpperCase() === 'Z' ? 'Z' : z.includes(':') ? z : `${z.slice(0, 3)}:${z.slice(3)}`);

function isoDateTime(text: string): string | null {
  const t = text.trim();
  const dt = ISO_DATE_TIME.exec(t);
  if (dt) {
    const [, y, mo, d, h, mi, s, z] = dt;
    return validDate(y, mo, d) && validTime(h, mi, s) ? `${y}-${mo}-${d}T${h}:${mi}:${s ?? '00'}${offsetOf(z)}` : null;
  }
  const date = ISO_DATE.exec(t);
  return date && validDate(date[1], date[2], date[3]) ? `${date[1]}-${date[2]}-${date[3]}` : null;
}

function isoTime(text: string): string | null {
  const m = ISO_TIME.exec(text.trim());
  return m && validTime(m[1], m[2], m[3]) ? `${m[1]}:${m[2]}:${m[3] ?? '00'}${offsetOf(m[4])}` : null;
}

/** Matches of the lab's pattern that do not touch another letter or digit, upper case, without repeats. */
function codesIn(text: string, pattern: RegExp | undefined): string[] {
  if (!pattern) return [];
  const source = pattern.source.replace(/^\^/, '').replace(/\$$/, '');
  const found = text.match(new RegExp(`(?<![0-9A-Za-z])(?:${source})(?![0-9A-Za-z])`, 'gi')) ?? [];
  return [...new Set(found.map((c) => c.toUpperCase()))];
}

/** The lines before the data block, without the column header that introduces it. */
function metadataLines(text: string, maxLines: number): string[] {
  const lines: string[] = [];
  let start = 0;
  while (start <= text.length && lines.length < maxLines) {
    const end = text.indexOf('\n', start);
    const line = (end < 0 ? text.slice(start) : text.slice(start, end)).replace(/\r$/, '');
    if (isDataRow(line)) {
      // the last non-empty, uncommented line before the data names its columns
      for (let i = lines.length - 1; i >= 0; i--) {
        if (!lines[i].trim()) continue;
        if (!COMMENT_MARK.test(lines[i])) lines[i] = '';
        break;
      }
      return lines;
    }
    lines.push(line);
    if (end < 0) break;
    start = end + 1;
  }
  return lines;
}

/**
 * Reads what an export states about itself. `fileName` may carry a path (only its last part is
 * read); `text` is the export as uploaded. Pure: no I/O, and no value is completed by a guess.
 */
export function readExportMetadata(fileName: string, text: string, options: ReadExportMetadataOptions = {}): ExportMetadata {
  const baseName = fileName.split(/[/\\]/).pop() ?? fileName;
  const result: ExportMetadata = {
    fileNameCodes: codesIn(baseName, options.codePattern),
    sample: null,
    temperature: null,
    instrument: null,
    measuredAt: null,
    notes: [],
  };
  let date: StatedText | null = null;
  let time: StatedText | null = null;
  const lines = metadataLines(text.replace(/^\uFEFF/, ''), options.maxLines ?? 2000);
  lines.forEach((content, index) => {
    const line = index + 1;
    for (const { rawKey, value } of statements(content)) {
      if (!value) continue;
      const { key, unit } = normaliseKey(rawKey);
      if (SAMPLE_KEYS.has(key) && !result.sample) {
        result.sample = { text: value, line, codes: codesIn(value, options.codePattern) };
      } else if (TEMPERATURE_KEYS.has(key) && !result.temperature) {
        result.temperature = readTemperature(value, unit, line, result.notes);
      } else if (INSTRUMENT_KEYS.has(key) && !result.instrument) {
        result.instrument = { text: value, line };
      } else if (DATETIME_KEYS.has(key) && !result.measuredAt) {
        result.measuredAt = { text: value, line, iso: isoDateTime(value) };
      } else if (DATE_KEYS.has(key) && !date) {
        date = { text: value, line };
      } else if (TIME_KEYS.has(key) && !time) {
        time = { text: value, line };
      }
    }
  });
  if (!result.measuredAt && date) result.measuredAt = combineDateAndTime(date, time);
  return result;
}

function combineDateAndTime(date: StatedText, time: StatedText | null): StatedDateTime {
  const day = isoDateTime(date.text);
  if (!time) return { ...date, iso: day };
  const clock = isoTime(time.text);
  const iso = day && day.length === 10 && clock ? `${day}T${clock}` : day;
  return { text: `${date.text} ${time.text}`, line: date.line, iso };
}
