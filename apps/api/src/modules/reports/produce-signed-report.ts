import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { ReportData } from './pdf/report-data';
import { runCpuTask } from '../../core/cpu-pool/cpu-pool';
import { credentialForSigning } from './signing/signing-credentials';
import { stageClock } from './issuance-stages';

export interface SignedReport {
  pdf: Buffer;
  sha256: string;
  signingCredentialId: string;
}

/** Renders the report and signs it with the lab's credential; the hash is of the signed bytes. */
export async function produceSignedReport(manager: EntityManager, lab: { id: string; name: string }, data: ReportData): Promise<SignedReport> {
  const [row]: Array<{ logo: Buffer | null }> = await manager.query('SELECT logo FROM lab WHERE id = $1', [lab.id]);
  const credential = await credentialForSigning(manager, lab);
  const clock = stageClock();
  clock?.lap('loadCredential');
  // Rendering and signing take CPU: a worker thread does both.
  const { pdf: signed, renderMs, signMs } = await runCpuTask('renderAndSign', {
    data,
    logo: row?.logo ? new Uint8Array(row.logo) : null,
    p12: new Uint8Array(credential.p12),
    passphrase: credential.passphrase,
    signature: {
      // The number in the signature's reason is readable in the file without decompressing anything,
      // which lets the public page say which report an altered upload claims to be.
      reason: `Test report ${data.reportNumber}`,
      signerName: data.lab.name,
      location: data.lab.siteOfTesting ?? data.lab.address.join(', '),
      contactInfo: data.lab.contactEmail ?? '',
      signingTime: new Date(data.issuedAt),
    },
  });
  // the rest of the task's time is its wait for a free thread and the hand-over both ways
  clock?.lapSplit({ render: renderMs, sign: signMs }, 'threadWait');
  const pdf = Buffer.from(signed.buffer, signed.byteOffset, signed.byteLength);
  return { pdf, sha256: createHash('sha256').update(pdf).digest('hex'), signingCredentialId: credential.id };
}
