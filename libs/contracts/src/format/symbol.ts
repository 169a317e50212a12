import type { QuantityPart } from './quantity';

/**
 * A parameter's symbol as drawn on screens and reports: 'rInf' or 'R_inf' → R with subscript ∞,
 * 'cdl' or 'C_dl' → C with subscript dl, 'tau' → τ. Returns runs (the base, then any subscript) and
 * a plain-text form: Unicode subscripts where every character has one (R₀), else the letters run
 * on (Rct); ∞ stays on the line (R∞), as it is commonly printed.
 */
export interface FormattedSymbol {
  readonly parts: readonly QuantityPart[];
  readonly text: string;
}

const GREEK: Record<string, string> = {
  alpha: 'α', beta: 'β', gamma: 'γ', delta: 'δ', epsilon: 'ε', eta: 'η', theta: 'θ', kappa: 'κ', lambda: 'λ',
  mu: 'μ', nu: 'ν', rho: 'ρ', sigma: 'σ', tau: 'τ', phi: 'φ', chi: 'χ', psi: 'ψ', omega: 'ω', Omega: 'Ω',
};
const SUBSCRIPT_TEXT: Record<string, string> = { inf: '∞', infinity: '∞' };
const UNICODE_SUBSCRIPTS: Record<string, string> = {
  '0': '₀', '1': '₁', '2': '₂', '3': '₃', '4': '₄', '5': '₅', '6': '₆', '7': '₇', '8': '₈', '9': '₉',
  a: 'ₐ', e: 'ₑ', h: 'ₕ', k: 'ₖ', l: 'ₗ', m: 'ₘ', n: 'ₙ', o: 'ₒ', p: 'ₚ', s: 'ₛ', t: 'ₜ', x: 'ₓ',
};
/** Circuit-element letters written in capitals (R, C, L, Q, Z, W); anything else keeps its case. */
const ELEMENTS = new Set(['r', 'c', 'l', 'q', 'z', 'w']);

function splitName(name: string): [string, string] {
  const underscore = name.indexOf('_');
  if (underscore > 0) return [name.slice(0, underscore), name.slice(underscore + 1)];
  if (GREEK[name]) return [name, ''];
  const camel = /^([a-zA-Z])([A-Z0-9].*)$/.exec(name);
  if (camel) return [camel[1], camel[2]];
  // rs, rct, cdl, z0: a circuit-element letter followed by its lower-case qualifier
  const element = /^([rclqzw])([a-z0-9]+)$/.exec(name);
  if (element) return [element[1], element[2]];
  return [name, ''];
}

export function formatSymbol(name: string): FormattedSymbol {
  const [rawBase, rawSub] = splitName(name.trim());
  const base = GREEK[rawBase] ?? (rawBase.length === 1 && ELEMENTS.has(rawBase) ? rawBase.toUpperCase() : rawBase);
  const subKey = rawSub.toLowerCase();
  const sub = SUBSCRIPT_TEXT[subKey] ?? GREEK[rawSub] ?? (/^[A-Z][a-z]+$/.test(rawSub) ? rawSub.toLowerCase() : rawSub);
  if (!sub) return { parts: [{ text: base, role: 'normal' }], text: base };
  const parts: QuantityPart[] = [{ text: base, role: 'normal' }, { text: sub, role: 'sub' }];
  const unicode = [...sub].every((c) => UNICODE_SUBSCRIPTS[c]) ? [...sub].map((c) => UNICODE_SUBSCRIPTS[c]).join('') : sub;
  return { parts, text: `${base}${unicode}` };
}

/**
 * A parameter's description without its trailing symbol, for a table that draws the symbol in a
 * column of its own: ("Series resistance Rs", "rs") → "Series resistance".
 */
export function describeWithoutSymbol(description: string, name: string): string {
  const words = description.trim().split(/\s+/);
  const plain = (t: string) => t.normalize('NFKD').replace(/[^\p{L}\p{N}∞]/gu, '').toLowerCase();
  const symbol = plain(formatSymbol(name).parts.map((p) => p.text).join(''));
  return words.length > 1 && plain(words[words.length - 1]) === symbol ? words.slice(0, -1).join(' ') : description;
}
