import type { ReportData } from './report-data';
import { formatCelsius, formatDate } from './report-formats';

const SOURCE_WORDS = { file: 'stated in the export', entered: 'entered by the analyst', 'entered-over-file': 'entered by the analyst over the export’s value' } as const;

/** "19 °C (stated in the export)" for one shared temperature, else one entry per replicate. */
export function measurementTemperatureText(data: ReportData): string | null {
  const temps = data.method.measurementTemperatures;
  if (!temps?.length) return null;
  const first = temps[0];
  if (temps.every((t) => t.temperatureC === first.temperatureC && t.source === first.source)) {
    return `${formatCelsius(first.temperatureC)} for ${temps.length === 1 ? 'the replicate' : `all ${temps.length} replicates`} (${SOURCE_WORDS[first.source]})`;
  }
  return temps.map((t) => `replicate ${t.replicateNumber}: ${formatCelsius(t.temperatureC)} (${SOURCE_WORDS[t.source]})`).join('; ');
}

/** The referral applied: from the measurement temperature to the method's reference temperature. */
export function referralText(data: ReportData): string {
  const m = data.method;
  return (
    `each spectrum divided by the cell constant and referred to ${formatCelsius(m.referenceTemperatureC)} ` +
    `with a linear coefficient α of ${Number((m.temperatureCoefficientPerC * 100).toPrecision(3))} %/°C: Z · (1 + α (T − T₀)) / K, T₀ being the reference temperature`
  );
}

export function followsText(data: ReportData): string | null {
  const f = data.follows;
  if (!f) return null;
  return `Follows revoked report ${f.reportNumber}. That report was revoked on ${formatDate(f.revokedAt)} (reason: ${f.reason}); this report gives the result of the sample’s new analysis and replaces none in force.`;
}
