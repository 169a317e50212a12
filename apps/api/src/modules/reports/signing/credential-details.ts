import { createHash } from 'node:crypto';
import forge from 'node-forge';
import { Pkcs12ShapeError, checkIterations, withIterationGuard } from './pkcs12-iterations';

/** Public facts about a signing credential; the key itself never leaves this module's callers. */
export interface CredentialDetails {
  subject: string;
  issuer: string;
  serialNumber: string;
  /** SHA-256 of the certificate's DER encoding, as colon-separated upper-case hex. */
  fingerprintSha256: string;
  notBefore: Date;
  notAfter: Date;
}

/** A PKCS#12 file that cannot be used for signing, with the reason in words for the uploader. */
export class CredentialError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CredentialError';
  }
}

const distinguishedName = (attributes: forge.pki.CertificateField[]): string =>
  attributes.map((a) => `${a.shortName ?? a.name}=${String(a.value)}`).join(', ');

/** Opens a PKCS#12 file, checks it holds one private key with its certificate, and describes it. */
export function readCredential(p12: Buffer, passphrase: string, now = new Date()): CredentialDetails {
  let parsed: forge.pkcs12.Pkcs12Pfx;
  try {
    // Before deriving any key: the file's shape, and iteration counts within the limit.
    checkIterations(p12);
    const asn1 = forge.asn1.fromDer(forge.util.createBuffer(p12.toString('binary')));
    parsed = withIterationGuard(() => forge.pkcs12.pkcs12FromAsn1(asn1, false, passphrase));
  } catch (error) {
    if (error instanceof Pkcs12ShapeError) throw new CredentialError(error.message);
    const reason = error instanceof Error && /mac|password|invalid/i.test(error.message) ? 'the passphrase is wrong or the file is damaged' : 'it is not a PKCS#12 (.p12/.pfx) file';
    throw new CredentialError(`The signing credential could not be opened: ${reason}.`);
  }
  const keys = [
    ...(parsed.getBags({ bagType: forge.pki.oids.pkcs8ShroudedKeyBag })[forge.pki.oids.pkcs8ShroudedKeyBag] ?? []),
    ...(parsed.getBags({ bagType: forge.pki.oids.keyBag })[forge.pki.oids.keyBag] ?? []),
  ].filter((b) => b.key);
  const certs = (parsed.getBags({ bagType: forge.pki.oids.certBag })[forge.pki.oids.certBag] ?? []).filter((b) => b.cert);
  if (keys.length === 0) throw new CredentialError('The PKCS#12 file holds no private key; export it with the key included.');
  if (certs.length === 0) throw new CredentialError('The PKCS#12 file holds no certificate.');
  const key = keys[0].key as forge.pki.rsa.PrivateKey;
  const cert =
    certs.map((b) => b.cert as forge.pki.Certificate).find((c) => {
      const pub = c.publicKey as forge.pki.rsa.PublicKey;
      return pub.n && pub.n.equals(key.n);
    }) ?? null;
  if (!cert) throw new CredentialError("No certificate in the file matches its private key.");
  if (cert.validity.notAfter < now) throw new CredentialError(`The certificate expired on ${cert.validity.notAfter.toISOString().slice(0, 10)}.`);
  if (cert.validity.notBefore > now) throw new CredentialError(`The certificate is not valid before ${cert.validity.notBefore.toISOString().slice(0, 10)}.`);
  const der = Buffer.from(forge.asn1.toDer(forge.pki.certificateToAsn1(cert)).getBytes(), 'binary');
  const hex = createHash('sha256').update(der).digest('hex').toUpperCase();
  return {
    subject: distinguishedName(cert.subject.attributes),
    issuer: distinguishedName(cert.issuer.attributes),
    serialNumber: cert.serialNumber,
    fingerprintSha256: hex.match(/../g)!.join(':'),
    notBefore: cert.validity.notBefore,
    notAfter: cert.validity.notAfter,
  };
}
