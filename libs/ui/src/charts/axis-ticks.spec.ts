import { scaleLog } from 'd3-scale';
import { logTicks } from './axis-ticks';
import { formatHz } from './si-format';

describe('logTicks', () => {
  it('places decades and their multiples where log10 puts them', () => {
    const x = scaleLog().domain([10, 1000]).range([68, 624]);
    const ticks = logTicks(x, formatHz);
    const at = (label: string) => ticks.find((t) => t.label === label)!.position;
    expect(at('10 Hz')).toBeCloseTo(68, 9);
    expect(at('100 Hz')).toBeCloseTo(346, 9);
    // numpy 2.4.6: 68 + (np.log10(500) - 1)/2 · 556 = 540.3136612054132 (the 500 Hz minor tick)
    expect(ticks.some((t) => !t.major && Math.abs(t.position - 540.3136612054132) < 1e-9)).toBe(true);
    expect(ticks.filter((t) => t.major)).toHaveLength(3);
    expect(ticks.filter((t) => !t.major)).toHaveLength(16);
  });

  it('drops minor ticks and every other label over a very wide band', () => {
    const x = scaleLog().domain([1e-3, 1e7]).range([0, 500]);
    const ticks = logTicks(x, formatHz);
    expect(ticks.every((t) => t.major)).toBe(true);
    expect(ticks.filter((t) => t.label).map((t) => t.label)).toEqual(['1 mHz', '100 mHz', '10 Hz', '1 kHz', '100 kHz', '10 MHz']);
  });
});
