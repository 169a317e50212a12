import { splitIntoRuns } from './inter-fonts';

const drawn = (text: string): string => splitIntoRuns(text).map((r) => r.text).join('');
const subsetOf = (text: string, ch: string): string | undefined => splitIntoRuns(text).find((r) => r.text.includes(ch))?.subset;

describe('text drawn with the shipped Inter subsets', () => {
  it('draws Greek symbols from the greek subset and plain text from latin', () => {
    expect(subsetOf('Relaxation time τ', 'τ')).toBe('greek');
    expect(subsetOf('Relaxation time τ', 'R')).toBe('latin');
    expect(drawn('Relaxation time τ')).toBe('Relaxation time τ');
  });

  it('writes glyphs no subset carries so a reader still understands them', () => {
    expect(drawn('High-frequency resistance R∞')).toBe('High-frequency resistance R_inf');
    expect(drawn('bounds [0, ∞)')).toBe('bounds [0, infinity)');
    expect(drawn('S·sⁿ·cm⁻¹')).toBe('S·s^n·cm^-1');
    expect(drawn('T ≤ 25 °C')).toBe('T <= 25 °C');
  });

  it('keeps accented letters of names, from latin-ext where latin lacks them', () => {
    expect(drawn('Łódź Škoda')).toBe('Łódź Škoda');
    expect(subsetOf('Łódź', 'Ł')).toBe('latin-ext');
  });
});
