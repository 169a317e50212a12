const DECIMAL_POINT = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA = /^[+-]?(?:\d+(?:,\d*)?|,\d+)(?:[eE][+-]?\d+)?$/;

/**
 * A cell as a finite number, or null when it is not one. A decimal comma is accepted only when
 * commas do not separate cells. NaN, infinities and thousands separators are not numbers here.
 */
export function readNumber(cell: string, decimalComma: boolean): number | null {
  const text = cell.trim().replace(/^"(.*)"$/, '$1').trim().replace(/^\u2212/, '-');
  let value: number | null = null;
  if (DECIMAL_POINT.test(text)) value = Number(text);
  else if (decimalComma && DECIMAL_COMMA.test(text)) value = Number(text.replace(',', '.'));
  return value !== null && Number.isFinite(value) ? value : null;
}
