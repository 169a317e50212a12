const PREFIXES: readonly [number, string][] = [
  [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'],
];

/**
 * A value with an SI prefix and at most `significant` significant digits, trailing zeros
 * dropped: 12500 Hz → "12.5 kHz", 0.1 Hz → "100 mHz".
 */
export function formatSi(value: number, unit: string, significant = 3): string {
  if (!Number.isFinite(value)) return `– ${unit}`;
  if (value === 0) return `0 ${unit}`;
  const magnitude = Math.abs(value);
  // Round first so 999.96 prints as "1 k…" rather than "1000 …".
  const rounded = Number(magnitude.toPrecision(significant));
  const [factor, prefix] = PREFIXES.find(([f]) => rounded >= f) ?? PREFIXES[PREFIXES.length - 1];
  const scaled = Number((rounded / factor).toPrecision(significant));
  return `${value < 0 ? '−' : ''}${scaled} ${prefix}${unit}`;
}

export const formatHz = (hz: number): string => formatSi(hz, 'Hz');
export const formatOhm = (ohm: number): string => formatSi(ohm, 'Ω');

/** A plain number for tables and tick labels, with a true minus sign. */
export function formatNumber(value: number, significant = 4): string {
  if (!Number.isFinite(value)) return '–';
  const text = String(Number(value.toPrecision(significant)));
  return text.startsWith('-') ? `−${text.slice(1)}` : text;
}
