/**
 * Field names as people read them in messages ("arrivedAt" → "arrival time"). The API keeps the
 * machine path in a problem's `errors[].field` (the portals put each message beside its control);
 * the sentence a person reads uses these words. Names not listed read as their parts split at
 * capitals ("claimedLot" → "claimed lot"); a list position reads from 1 ("samples.0.code" →
 * "samples 1, code").
 */
export const FIELD_WORDS: Readonly<Record<string, string>> = {
  arrivedAt: 'arrival time',
  occurredAt: 'time of the event',
  measuredAt: 'measurement time',
  temperatureC: 'temperature (°C)',
  arrivalTemperatureC: 'temperature on arrival (°C)',
  volumeMl: 'volume (ml)',
  sealIntact: 'seal',
  containerCondition: 'container condition',
  overrideReason: 'reason for accepting despite the warnings',
  productId: 'product',
  methodVersionId: 'method version',
  libraryVersionId: 'library version',
  instrumentId: 'instrument',
  cellId: 'cell',
  clientOrganisationId: 'client organisation',
  currentPassword: 'current password',
  newPassword: 'new password',
  displayName: 'name',
  q: 'search',
  pageSize: 'page size',
  dir: 'sort direction',
  obtainedWhere: 'where obtained',
  obtainedOn: 'date obtained',
  claimedLot: 'lot claimed',
  labelText: 'label text',
  trackingNumber: 'tracking number',
  certifiedConductivityAt25UsPerCm: 'certified conductivity at 25 °C (µS/cm)',
};

function segmentInWords(segment: string): string {
  return FIELD_WORDS[segment] ?? segment.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/[-_]+/g, ' ').toLowerCase();
}

export function fieldInWords(path: string): string {
  const parts: string[] = [];
  for (const segment of path.split('.').filter(Boolean)) {
    if (/^\d+$/.test(segment) && parts.length) parts[parts.length - 1] += ` ${Number(segment) + 1}`;
    else parts.push(segmentInWords(segment));
  }
  return parts.join(', ') || path;
}
