import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { ReportData } from './pdf/report-data';
import { renderReportPdf } from './pdf/render-report-pdf';
import { signPdf } from './signing/sign-pdf';
import { credentialForSigning } from './signing/signing-credentials';

export interface SignedReport {
  pdf: Buffer;
  sha256: string;
  signingCredentialId: string;
}

/** Renders the report and signs it with the lab's credential; the hash is of the signed bytes. */
export async function produceSignedReport(manager: EntityManager, lab: { id: string; name: string }, data: ReportData): Promise<SignedReport> {
  const [row]: Array<{ logo: Buffer | null }> = await manager.query('SELECT logo FROM lab WHERE id = $1', [lab.id]);
  const unsigned = await renderReportPdf(data, { logo: row?.logo ?? null });
  const credential = await credentialForSigning(manager, lab);
  const pdf = await signPdf(unsigned, credential.p12, credential.passphrase, {
    // The number in the signature's reason is readable in the file without decompressing anything,
    // which lets the public page say which report an altered upload claims to be.
    reason: `Test report ${data.reportNumber}`,
    signerName: data.lab.name,
    location: data.lab.siteOfTesting ?? data.lab.address.join(', '),
    contactInfo: data.lab.contactEmail ?? '',
    signingTime: new Date(data.issuedAt),
  });
  return { pdf, sha256: createHash('sha256').update(pdf).digest('hex'), signingCredentialId: credential.id };
}
