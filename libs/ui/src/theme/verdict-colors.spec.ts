/**
 * @jest-environment node
 */
import { compileString } from 'sass';

// Compiles the real theme, so the check follows any change of palette or tone.
const css = compileString("@use 'ohmprint-theme' as theme; @include theme.apply();", {
  loadPaths: ['libs/ui/src/theme', 'node_modules'],
}).css;

function token(name: string): { light: string; dark: string } {
  const m = new RegExp(`--${name}: light-dark\\((#[0-9a-f]{6}), (#[0-9a-f]{6})\\)`).exec(css);
  if (!m) throw new Error(`--${name} is not a light-dark() pair of hex colours in the compiled theme`);
  return { light: m[1], dark: m[2] };
}

// Relative luminance and contrast ratio as defined in WCAG 2.1 (success criterion 1.4.3, "relative luminance").
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('verdict colour tokens', () => {
  it('computes contrast as WCAG defines it', () => {
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 10); // WCAG 2.1: black on white is 21:1
    expect(contrast('#777777', '#ffffff')).toBeCloseTo(4.48, 2); // WebAIM contrast checker reads 4.48:1 for #777 on white (from memory)
  });

  it.each(['consistent', 'inconclusive', 'not-consistent'])('gives %s chips AA text contrast in light and dark schemes', (verdict) => {
    const bg = token(`ohm-verdict-${verdict}-container`);
    const fg = token(`ohm-verdict-${verdict}-on-container`);
    expect(contrast(fg.light, bg.light)).toBeGreaterThanOrEqual(4.5); // WCAG 2.1 SC 1.4.3 AA, normal text
    expect(contrast(fg.dark, bg.dark)).toBeGreaterThanOrEqual(4.5);
  });

  it('keeps green, amber and red apart: consistent is green-dominant, not consistent red-dominant', () => {
    const rgb = (hex: string) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));
    const [gr, gg] = rgb(token('ohm-verdict-consistent-mark').light);
    const [rr, rg] = rgb(token('ohm-verdict-not-consistent-mark').light);
    const [ar, ag, ab] = rgb(token('ohm-verdict-inconclusive-mark').light);
    expect(gg).toBeGreaterThan(gr);
    expect(rr).toBeGreaterThan(rg);
    expect(ar).toBeGreaterThan(ag);
    expect(ag).toBeGreaterThan(ab);
  });

  it('draws no verdict from the theme’s own neutral tokens', () => {
    expect(css).toContain('--ohm-verdict-no-verdict-container: var(--mat-sys-surface-container-highest)');
  });
});
