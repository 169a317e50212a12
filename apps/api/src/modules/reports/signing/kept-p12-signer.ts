import { constants, createHash, createPrivateKey, privateEncrypt, type KeyObject } from 'node:crypto';
import forge from 'node-forge';
import { Signer, SignPdfError } from '@signpdf/utils';

/**
 * Signs a PDF with a PKCS#12 credential as `@signpdf/signer-p12` does (the same PKCS#7 detached
 * SHA-256 signature with the same three authenticated attributes in the same order, so the bytes
 * are identical), with two savings for a worker thread that signs report after report:
 * - the credential is opened once per thread, not per report (opening runs the file's key
 *   derivation, thousands of SHA-1 rounds in JavaScript), and kept under a hash of its bytes and
 *   passphrase, so a replaced credential is opened afresh;
 * - the RSA operation runs in Node's crypto (OpenSSL) rather than in JavaScript big numbers.
 *   RSASSA-PKCS1-v1_5 is deterministic: OpenSSL's private-key operation with PKCS#1 type-1
 *   padding over the DigestInfo gives the very signature forge computes.
 */
interface OpenedCredential {
  certificates: forge.pki.Certificate[];
  signingCertificate: forge.pki.Certificate;
  forgeKey: forge.pki.rsa.PrivateKey;
  nodeKey: KeyObject;
}

/** Credentials a thread keeps open (a lab uses one at a time; a few labs share a worker). */
const KEPT = 16;
const opened = new Map<string, OpenedCredential>();

/** DER prefix of a DigestInfo for SHA-256 (RFC 8017 §9.2, note 1). */
const SHA256_DIGEST_INFO = Buffer.from('3031300d060960864801650304020105000420', 'hex');

function open(p12: Buffer, passphrase: string): OpenedCredential {
  const key = createHash('sha256').update(p12).update('\u0000').update(passphrase, 'utf8').digest('hex');
  const kept = opened.get(key);
  if (kept) {
    // most recently used last, so the oldest is the first to go
    opened.delete(key);
    opened.set(key, kept);
    return kept;
  }
  const asn1 = forge.asn1.fromDer(forge.util.createBuffer(p12.toString('binary')));
  const bundle = forge.pkcs12.pkcs12FromAsn1(asn1, false, passphrase);
  const certBags = bundle.getBags({ bagType: forge.pki.oids.certBag })[forge.pki.oids.certBag] ?? [];
  const keyBags = bundle.getBags({ bagType: forge.pki.oids.pkcs8ShroudedKeyBag })[forge.pki.oids.pkcs8ShroudedKeyBag] ?? [];
  const forgeKey = keyBags[0]?.key as forge.pki.rsa.PrivateKey | undefined;
  if (!forgeKey) throw new SignPdfError('The credential holds no private key.', SignPdfError.TYPE_INPUT);
  const certificates = certBags.map((b) => b.cert).filter((c): c is forge.pki.Certificate => !!c);
  // the last certificate whose public key matches the private key, as signer-p12 chooses it
  let signingCertificate: forge.pki.Certificate | undefined;
  for (const cert of certificates) {
    const pub = cert.publicKey as forge.pki.rsa.PublicKey;
    if (forgeKey.n.compareTo(pub.n) === 0 && forgeKey.e.compareTo(pub.e) === 0) signingCertificate = cert;
  }
  if (!signingCertificate) throw new SignPdfError('Failed to find a certificate that matches the private key.', SignPdfError.TYPE_INPUT);
  const nodeKey = createPrivateKey(forge.pki.privateKeyToPem(forgeKey));
  const credential = { certificates, signingCertificate, forgeKey, nodeKey };
  opened.set(key, credential);
  while (opened.size > KEPT) opened.delete(opened.keys().next().value as string);
  return credential;
}

export class KeptP12Signer extends Signer {
  constructor(
    private readonly p12: Buffer,
    private readonly passphrase: string,
  ) {
    super();
  }

  override async sign(pdfBuffer: Buffer, signingTime?: Date): Promise<Buffer> {
    if (!(pdfBuffer instanceof Buffer)) throw new SignPdfError('PDF expected as Buffer.', SignPdfError.TYPE_INPUT);
    const credential = open(this.p12, this.passphrase);
    const p7 = forge.pkcs7.createSignedData();
    p7.content = forge.util.createBuffer(pdfBuffer.toString('binary'));
    for (const cert of credential.certificates) p7.addCertificate(cert);
    // forge asks the key to sign the digest of the authenticated attributes; OpenSSL does the RSA
    const key = Object.create(credential.forgeKey) as forge.pki.rsa.PrivateKey;
    key.sign = (md: forge.md.MessageDigest, scheme?: unknown) => {
      if (md.algorithm !== 'sha256' || (scheme !== undefined && scheme !== 'RSASSA-PKCS1-V1_5')) return credential.forgeKey.sign(md, scheme as never);
      const digestInfo = Buffer.concat([SHA256_DIGEST_INFO, Buffer.from(md.digest().getBytes(), 'binary')]);
      return privateEncrypt({ key: credential.nodeKey, padding: constants.RSA_PKCS1_PADDING }, digestInfo).toString('binary');
    };
    p7.addSigner({
      key,
      certificate: credential.signingCertificate,
      digestAlgorithm: forge.pki.oids.sha256,
      authenticatedAttributes: [
        { type: forge.pki.oids.contentType, value: forge.pki.oids.data },
        // forge's typings say string; it takes (and signer-p12 passes) a Date
        { type: forge.pki.oids.signingTime, value: (signingTime ?? new Date()) as unknown as string },
        { type: forge.pki.oids.messageDigest },
      ],
    });
    p7.sign({ detached: true });
    return Buffer.from(forge.asn1.toDer(p7.toAsn1()).getBytes(), 'binary');
  }
}
