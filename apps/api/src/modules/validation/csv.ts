/**
 * CSV for spreadsheets, safe against formula injection: a text cell that begins with = + - @,
 * a tab or a carriage return is prefixed with a single quote so a spreadsheet shows it as text
 * (OWASP, "CSV Injection"). Numbers we compute are written as numbers. Cells with a comma, quote
 * or line break are quoted (RFC 4180).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

export type CsvValue = string | number | boolean | null | undefined;

export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  let text = String(value);
  if (FORMULA_START.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(header: string[], rows: CsvValue[][]): string {
  return [header, ...rows].map((row) => row.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
