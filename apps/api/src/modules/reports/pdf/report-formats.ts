import { quantityText } from '@ohmprint/contracts';

/** How numbers and dates read on a report: fixed English style, UTC, so every copy reads alike. */
const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
const timeFormat = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit', hour12: false, timeZone: 'UTC' });

export function formatDate(iso: string): string {
  return dateFormat.format(new Date(iso));
}

export function formatDateTime(iso: string): string {
  const d = new Date(iso);
  return `${dateFormat.format(d)}, ${timeFormat.format(d)} UTC`;
}

/**
 * A number with `significant` significant figures in the shared format (libs/contracts/src/format):
 * plain between 10⁻³ and 10⁵, else scientific notation with a real superscript (3.10 × 10⁻⁴).
 */
export function formatNumber(v: number, significant: number): string {
  if (!Number.isFinite(v)) return 'not finite';
  return quantityText(v, { significant, notation: 'auto-scientific' });
}

export function formatPercent(share: number): string {
  return `${Number((share * 100).toFixed(1))} %`;
}

/** A temperature to 0.1 °C (the resolution bench thermometers give), with a true minus sign. */
export function formatCelsius(t: number): string {
  if (!Number.isFinite(t)) return 'not finite';
  const text = t.toFixed(1);
  return `${text.startsWith('-') && Number(text) !== 0 ? `\u2212${text.slice(1)}` : text.replace(/^-/, '')} °C`;
}

/** A frequency with an SI prefix: 10 Hz, 100 kHz. */
export function formatHz(hz: number): string {
  return quantityText(hz, { unit: 'Hz', significant: 3 }).replace(/\.0+ /, ' ');
}
