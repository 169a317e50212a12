import type { VerificationResult } from '@ohmprint/contracts';
import { fileVerdict } from './verification-look';

const base: VerificationResult = {
  outcome: 'valid',
  message: 'ok',
  report: null,
  supersededBy: null,
  revocation: null,
  file: null,
};

describe('fileVerdict', () => {
  it('says nothing about bytes when no file was uploaded', () => {
    expect(fileVerdict(base)).toBeNull();
  });

  it('confirms a byte-identical file with the start of its hash', () => {
    const r = { ...base, file: { sha256: 'a'.repeat(64), identical: true, claimedNumber: 'CAL-2026-000123' } };
    expect(fileVerdict(r)).toBe('The uploaded file is byte-identical to the PDF the lab issued (SHA-256 aaaaaaaaaaaaaaaa…).');
  });

  it('warns that a differing file may have been altered and names what it claims to be', () => {
    const r = { ...base, outcome: 'no-match' as const, file: { sha256: 'b'.repeat(64), identical: false, claimedNumber: 'CAL-2026-000123' } };
    expect(fileVerdict(r)).toContain('differs from every PDF the lab issued');
    expect(fileVerdict(r)).toContain('it claims to be CAL-2026-000123');
  });
});
