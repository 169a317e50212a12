import { formatHz, formatNumber, formatOhm, formatSi } from './si-format';

describe('SI formatting', () => {
  it('picks the prefix that keeps one to three integer digits', () => {
    expect(formatHz(12500)).toBe('12.5 kHz');
    expect(formatHz(0.1)).toBe('100 mHz');
    expect(formatHz(2e6)).toBe('2 MHz');
    expect(formatOhm(47.25)).toBe('47.3 Ω');
  });

  it('rounds before choosing the prefix so 999.96 reads as 1 k', () => {
    expect(formatOhm(999.96)).toBe('1 kΩ');
  });

  it('prints negatives with a true minus sign and never prints NaN', () => {
    expect(formatSi(-0.0042, 'S')).toBe('−4.2 mS');
    expect(formatNumber(-1.23456)).toBe('−1.235');
    expect(formatNumber(NaN)).toBe('–');
  });
});
