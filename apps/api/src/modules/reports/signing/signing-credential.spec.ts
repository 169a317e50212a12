import { randomBytes } from 'node:crypto';
import { createSelfSignedCredential } from './self-signed-credential';
import { CredentialError, readCredential } from './credential-details';
import { seal, unseal } from './sealed-secret';

describe('signing credentials', () => {
  const p12 = createSelfSignedCredential({ labName: 'Marlow Test House (demo)', passphrase: 'right passphrase', validDays: 30, now: new Date('2026-12-01T00:00:00Z') });

  it('describes a PKCS#12 file by subject, issuer, fingerprint and validity', () => {
    const d = readCredential(p12, 'right passphrase', new Date('2026-12-02T00:00:00Z'));
    expect(d.subject).toBe('CN=Marlow Test House (demo) report signing (development, self-signed), O=Marlow Test House (demo)');
    expect(d.issuer).toBe(d.subject);
    expect(d.fingerprintSha256).toMatch(/^([0-9A-F]{2}:){31}[0-9A-F]{2}$/);
    expect(d.notAfter.getTime() - new Date('2026-12-01T00:00:00Z').getTime()).toBe(30 * 86_400_000);
  });

  it('refuses a wrong passphrase with a message that says so', () => {
    expect(() => readCredential(p12, 'wrong', new Date('2026-12-02T00:00:00Z'))).toThrow(/passphrase is wrong/);
  });

  it('refuses a file that is not PKCS#12', () => {
    expect(() => readCredential(Buffer.from('%PDF-1.7 not a credential'), 'x')).toThrow(CredentialError);
  });

  it('refuses an expired certificate and names the date', () => {
    expect(() => readCredential(p12, 'right passphrase', new Date('2027-06-01T00:00:00Z'))).toThrow(/expired on 2026-12-31/);
  });
});

describe('sealing credential material at rest', () => {
  const key = randomBytes(32);

  it('opens what it sealed for the same row', () => {
    const sealed = seal(Buffer.from('secret'), key, 'lab-1/cred-1');
    expect(unseal(sealed, key, 'lab-1/cred-1').toString()).toBe('secret');
  });

  it('refuses a sealed value moved to another row or altered by one byte', () => {
    const sealed = seal(Buffer.from('secret'), key, 'lab-1/cred-1');
    expect(() => unseal(sealed, key, 'lab-2/cred-1')).toThrow();
    sealed[sealed.length - 1] ^= 1;
    expect(() => unseal(sealed, key, 'lab-1/cred-1')).toThrow();
  });
});
