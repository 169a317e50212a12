import type { VerificationResult } from '@ohmprint/contracts';
import { fileVerdict, outcomeLook } from './verification-look';

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

describe('outcomeLook', () => {
  const altered = { sha256: 'c'.repeat(64), identical: false, claimedNumber: 'CAL-2026-000123' };

  it('reads a report in force as valid when no file was uploaded or the file is identical', () => {
    expect(outcomeLook(base).heading).toBe('Valid report');
    expect(outcomeLook({ ...base, file: { ...altered, identical: true } }).tone).toBe('good');
  });

  it('never reads an altered copy as valid, even with the right number and code', () => {
    const look = outcomeLook({ ...base, file: altered });
    expect(look.tone).toBe('bad');
    expect(look.heading).toBe('This copy is not the PDF the lab issued');
  });

  it('keeps the revoked heading for a revoked report, even for an altered copy', () => {
    expect(outcomeLook({ ...base, outcome: 'revoked', file: altered }).heading).toBe('Revoked by the issuing lab');
  });
});
