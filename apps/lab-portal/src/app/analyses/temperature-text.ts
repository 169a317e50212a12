import type { Analysis, MeasurementTemperature } from '@ohmprint/contracts';

const SOURCE: Record<MeasurementTemperature['source'], string> = {
  file: 'stated in the file',
  entered: 'entered; the file states none',
  'entered-over-file': 'entered over the file’s value, with a reason',
};

const celsius = (t: number) => `${Number(t.toFixed(2))} °C`;

/** "Measured at 19 °C (stated in the file) for both replicates; referred to 20 °C with 2 %/°C." */
export function temperatureText(a: Pick<Analysis, 'method' | 'measurementTemperatures'>): string {
  const temps = a.measurementTemperatures ?? [];
  const referral = `referred to ${celsius(a.method.referenceTemperatureC)} with a linear coefficient of ${Number((a.method.temperatureCoefficientPerC * 100).toFixed(3))} %/°C`;
  if (!temps.length) return `Measurement temperature not recorded with this analysis; spectra ${referral}.`;
  const first = temps[0];
  const measured = temps.every((t) => t.temperatureC === first.temperatureC && t.source === first.source)
    ? `${celsius(first.temperatureC)} (${SOURCE[first.source]}) for ${temps.length === 1 ? 'the replicate' : `all ${temps.length} replicates`}`
    : temps.map((t) => `replicate ${t.replicateNumber} ${celsius(t.temperatureC)} (${SOURCE[t.source]})`).join(', ');
  return `Measured at ${measured}; spectra ${referral}.`;
}
