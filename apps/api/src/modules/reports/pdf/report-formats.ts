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

/** Significant-figure formatting that switches to exponent notation for very small or large values. */
export function formatNumber(v: number, significant: number): string {
  if (!Number.isFinite(v)) return 'not finite';
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e6) return Number(v.toPrecision(significant)).toString();
  const [mantissa, exponent] = v.toExponential(significant - 1).split('e');
  return `${mantissa} × 10^${Number(exponent)}`;
}

export function formatPercent(share: number): string {
  return `${Number((share * 100).toFixed(1))} %`;
}
