import { FALLBACK_SUBSET, splitIntoRuns } from './inter-fonts';

const drawn = (text: string): string => splitIntoRuns(text).map((r) => r.text).join('');
const subsetOf = (text: string, ch: string): string | undefined => splitIntoRuns(text).find((r) => r.text.includes(ch))?.subset;

describe('text drawn with the shipped Inter subsets', () => {
  it('draws Greek symbols from the greek subset and plain text from latin', () => {
    expect(subsetOf('Relaxation time τ', 'τ')).toBe('greek');
    expect(subsetOf('Relaxation time τ', 'R')).toBe('latin');
    expect(drawn('Relaxation time τ')).toBe('Relaxation time τ');
  });

  it('draws what no Inter subset carries (∞, superscripts, ≤) with the DejaVu fallback, unchanged', () => {
    expect(drawn('High-frequency resistance R∞')).toBe('High-frequency resistance R∞');
    expect(subsetOf('R∞', '∞')).toBe(FALLBACK_SUBSET);
    expect(subsetOf('R∞', 'R')).toBe('latin');
    expect(drawn('(6.103 ± 0.012) × 10⁻⁶ S·sⁿ')).toBe('(6.103 ± 0.012) × 10⁻⁶ S·sⁿ');
    expect(subsetOf('× 10⁻⁶', '⁻⁶')).toBe(FALLBACK_SUBSET);
    expect(drawn('T ≤ 25 °C')).toBe('T ≤ 25 °C');
  });

  it('keeps accented letters of names, from latin-ext where latin lacks them', () => {
    expect(drawn('Łódź Škoda')).toBe('Łódź Škoda');
    expect(subsetOf('Łódź', 'Ł')).toBe('latin-ext');
  });
});
