import { randomInt, timingSafeEqual } from 'node:crypto';
import { VERIFICATION_CODE_ALPHABET, VERIFICATION_CODE_LENGTH } from '@ohmprint/contracts';
import { config } from '../../config';

/** A fresh code: 12 symbols from a 30-symbol alphabet (≈ 59 bits), from the OS's CSPRNG. */
export function newVerificationCode(): string {
  let code = '';
  for (let i = 0; i < VERIFICATION_CODE_LENGTH; i++) code += VERIFICATION_CODE_ALPHABET[randomInt(VERIFICATION_CODE_ALPHABET.length)];
  return code;
}

/** As printed: groups of four, e.g. K7QM-4RTX-9WHP. */
export function formatVerificationCode(code: string): string {
  return code.match(/.{1,4}/g)?.join('-') ?? code;
}

/** Constant-time comparison of normalised codes, so response timing does not leak a prefix. */
export function codesMatch(stored: string, given: string): boolean {
  const a = Buffer.from(stored);
  const b = Buffer.from(given);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** The public page's address for a report: what the QR code and the e-mail point to. */
export function verificationUrl(number: string, code: string): string {
  const query = new URLSearchParams({ report: number, code: formatVerificationCode(code) });
  return `${config.publicBaseUrl}/verify?${query.toString()}`;
}
