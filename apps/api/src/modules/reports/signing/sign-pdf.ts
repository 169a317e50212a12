import { plainAddPlaceholder } from '@signpdf/placeholder-plain';
import signpdf from '@signpdf/signpdf';
import { KeptP12Signer } from './kept-p12-signer';

export interface SignatureFields {
  /** Shown by PDF readers as the reason; carries the report number so an uploaded copy names itself. */
  reason: string;
  signerName: string;
  location: string;
  contactInfo: string;
  signingTime: Date;
}

/** The PKCS#7 detached signature of a 2048-bit RSA key with its chain fits well inside this. */
const SIGNATURE_BYTES = 8192;

/** Adds a signature field and signs the whole PDF (adbe.pkcs7.detached, SHA-256; see `KeptP12Signer`). */
export async function signPdf(pdf: Buffer, p12: Buffer, passphrase: string, fields: SignatureFields): Promise<Buffer> {
  const prepared = plainAddPlaceholder({
    pdfBuffer: pdf,
    reason: fields.reason,
    name: fields.signerName,
    location: fields.location,
    contactInfo: fields.contactInfo,
    signingTime: fields.signingTime,
    signatureLength: SIGNATURE_BYTES,
    appName: 'Ohmprint',
  });
  return signpdf.sign(prepared, new KeptP12Signer(p12, passphrase), fields.signingTime);
}
