import type { ReportData } from './report-data';
import { formatDate, formatNumber } from './report-formats';

const SOURCE_WORDS = { file: 'stated in the export', entered: 'entered by the analyst', 'entered-over-file': 'entered by the analyst over the export’s value' } as const;

/** "19 °C (stated in the export)" for one shared temperature, else one entry per replicate. */
export function measurementTemperatureText(data: ReportData): string | null {
  const temps = data.method.measurementTemperatures;
  if (!temps?.length) return null;
  const first = temps[0];
  if (temps.every((t) => t.temperatureC === first.temperatureC && t.source === first.source)) {
    return `${formatNumber(first.temperatureC, 3)} °C for ${temps.length === 1 ? 'the replicate' : `all ${temps.length} replicates`} (${SOURCE_WORDS[first.source]})`;
  }
  return temps.map((t) => `replicate ${t.replicateNumber}: ${formatNumber(t.temperatureC, 3)} °C (${SOURCE_WORDS[t.source]})`).join('; ');
}

/** The referral applied: from the measurement temperature to the method's reference temperature. */
export function referralText(data: ReportData): string {
  const m = data.method;
  return (
    `each spectrum divided by the cell constant and referred to ${formatNumber(m.referenceTemperatureC, 3)} °C ` +
    `with a linear coefficient α of ${formatNumber(m.temperatureCoefficientPerC * 100, 3)} %/°C: Z · (1 + α (T − T_ref)) / K`
  );
}

export function followsText(data: ReportData): string | null {
  const f = data.follows;
  if (!f) return null;
  return `Follows revoked report ${f.reportNumber}. That report was revoked on ${formatDate(f.revokedAt)} (reason: ${f.reason}); this report gives the result of the sample’s new analysis and replaces none in force.`;
}
