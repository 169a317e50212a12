import { randomInt } from 'node:crypto';

/** Crockford base-32 without I, L, O and U: nothing a person or a scanner can misread. */
const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

function letters(n: number): string {
  let s = '';
  for (let i = 0; i < n; i++) s += ALPHABET[randomInt(ALPHABET.length)];
  return s;
}

/** A fresh sample code like `OP-7K3M-Q9` (32⁶ ≈ 10⁹ codes; the unique index catches a repeat). */
export function newSampleCode(): string {
  return `OP-${letters(4)}-${letters(2)}`;
}
