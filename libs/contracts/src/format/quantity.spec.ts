import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { formatQuantity, quantityText, roundStandardError } from './quantity';
import { describeWithoutSymbol, formatSymbol } from './symbol';

interface Case {
  value: number;
  standardError: number | null;
  unit: string;
  significant: number;
  text: string;
}

const fixture = JSON.parse(readFileSync(join(__dirname, '../../../../test/reference/fixtures/format/cases.json'), 'utf8')) as { cases: Case[] };

describe('formatQuantity', () => {
  it('matches 300 renderings computed independently with Python decimal (test/reference/fixtures/format)', () => {
    expect(fixture.cases.length).toBe(300);
    for (const c of fixture.cases) {
      const got = quantityText(c.value, { standardError: c.standardError, unit: c.unit, significant: c.significant });
      expect({ value: c.value, se: c.standardError, text: got }).toEqual({ value: c.value, se: c.standardError, text: c.text });
    }
  });

  // Review of Particle Physics, introduction, "Rounding" (from memory): 0.827 ± 0.119 → 0.83 ± 0.12,
  // 0.827 ± 0.367 → 0.8 ± 0.4.
  it('rounds the standard error to one or two digits by the 354/949 rule and the value to match', () => {
    expect(quantityText(0.827, { standardError: 0.119 })).toBe('0.83 ± 0.12');
    expect(quantityText(0.827, { standardError: 0.367 })).toBe('0.8 ± 0.4');
    // 950–999 rounds up to 1000 and keeps two digits
    expect(quantityText(12.3456, { standardError: 0.0987 })).toBe('12.35 ± 0.10');
    expect(roundStandardError(0.0354)).toEqual({ digits: '35', place: -3 });
    expect(roundStandardError(0.0355)).toEqual({ digits: '4', place: -2 });
  });

  // JCGM 100:2008 §7.2.2: m_S = 100.021 47 g with u_c = 0.35 mg.
  it('writes the GUM worked example of a mass standard with the same last decimal place', () => {
    expect(quantityText(100.02147, { standardError: 0.00035, unit: 'g' })).toBe('100.02147 ± 0.00035 g');
  });

  it('writes small capacitances with an SI prefix and compound units with a real superscript power of ten', () => {
    // the example: 6.1026 × 10⁻⁶ with an SE of 1.2 × 10⁻⁸ shares the SE's last place (10⁻⁹)
    expect(quantityText(0.0000061026, { standardError: 1.2e-8, unit: 'F' })).toBe('6.103 ± 0.012 µF');
    const q = formatQuantity(0.0000061026, { standardError: 1.2e-8, unit: 'S·sⁿ' });
    expect(q.text).toBe('(6.103 ± 0.012) × 10⁻⁶ S·sⁿ');
    expect(q.parts).toEqual([
      { text: '(6.103 ± 0.012) × 10', role: 'normal' },
      { text: '−6', role: 'sup' },
      { text: ' S·sⁿ', role: 'normal' },
    ]);
    expect(q).toMatchObject({ mantissa: '6.103', uncertainty: '0.012', exponent: -6, prefix: '' });
    expect(quantityText(6.755e-6, { significant: 4 })).toBe('6.755 × 10⁻⁶');
    expect(quantityText(12500, { unit: 'Hz', significant: 3 })).toBe('12500 Hz');
    expect(quantityText(125000, { unit: 'Hz', significant: 3 })).toBe('125 kHz');
    expect(quantityText(125000, { unit: 'Hz', significant: 3, notation: 'scientific' })).toBe('1.25 × 10⁵ Hz');
    expect(quantityText(0.000123, { notation: 'plain', significant: 2 })).toBe('0.00012');
    // pure numbers such as χ²: plain in range, else one digit before the point
    expect(quantityText(3.1e-4, { notation: 'auto-scientific', significant: 3 })).toBe('3.10 × 10⁻⁴');
    expect(quantityText(0.0188, { notation: 'auto-scientific', significant: 3 })).toBe('0.0188');
  });

  it('keeps significant digits when rounding carries into a new power of ten, and uses a true minus sign', () => {
    expect(quantityText(9.9996, { significant: 4 })).toBe('10.00');
    expect(quantityText(-0.0042, { significant: 2 })).toBe('−0.0042');
    expect(quantityText(0, { significant: 3 })).toBe('0.00');
    expect(quantityText(1.23, { standardError: 0 })).toBe('1.230');
    expect(quantityText(Number.NaN)).toBe('not a number');
    expect(quantityText(-0.0004, { standardError: 0.3 })).toBe('0.00 ± 0.30');
  });

  it('shows a value far smaller than its error as zero at the error’s place', () => {
    expect(quantityText(2e-9, { standardError: 4.2e-6, unit: 'F' })).toBe('0 ± 4 µF');
  });
});

describe('formatSymbol', () => {
  it('draws R∞, R₀, Rct, Cdl and Greek names from the engine’s parameter names or underscore forms', () => {
    expect(formatSymbol('rInf')).toEqual({ parts: [{ text: 'R', role: 'normal' }, { text: '∞', role: 'sub' }], text: 'R∞' });
    expect(formatSymbol('R_inf').text).toBe('R∞');
    expect(formatSymbol('r0').text).toBe('R₀');
    expect(formatSymbol('rs').text).toBe('Rₛ');
    expect(formatSymbol('rct')).toEqual({ parts: [{ text: 'R', role: 'normal' }, { text: 'ct', role: 'sub' }], text: 'Rct' });
    expect(formatSymbol('C_dl').parts).toEqual([{ text: 'C', role: 'normal' }, { text: 'dl', role: 'sub' }]);
    expect(formatSymbol('tau').text).toBe('τ');
    expect(formatSymbol('sigma').text).toBe('σ');
    expect(formatSymbol('q').text).toBe('Q');
    expect(formatSymbol('n').text).toBe('n');
    expect(formatSymbol('alpha').text).toBe('α');
  });

  it('drops the symbol from a description when a table draws it in its own column', () => {
    expect(describeWithoutSymbol('High-frequency resistance R∞', 'rInf')).toBe('High-frequency resistance');
    expect(describeWithoutSymbol('Charge-transfer resistance Rct', 'rct')).toBe('Charge-transfer resistance');
    expect(describeWithoutSymbol('Relaxation time τ', 'tau')).toBe('Relaxation time');
    expect(describeWithoutSymbol('Dispersion exponent α (1 = single relaxation)', 'alpha')).toBe('Dispersion exponent α (1 = single relaxation)');
  });
});
