/** A frequency in Hz written the way people read it in messages: "50 Hz", "12.5 kHz", "1 MHz". */
export function formatFrequency(hz: number): string {
  const units: [number, string][] = [[1e9, 'GHz'], [1e6, 'MHz'], [1e3, 'kHz'], [1, 'Hz'], [1e-3, 'mHz'], [1e-6, 'µHz']];
  const abs = Math.abs(hz);
  const [scale, unit] = units.find(([s]) => abs >= s) ?? units[units.length - 1];
  return `${Number((hz / scale).toPrecision(4))} ${unit}`;
}
