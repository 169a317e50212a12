import type { PdfDigest } from './pdf-digest-storage';
import type { EntityManager } from 'typeorm';
import type { VerificationResult } from '@ohmprint/contracts';
import { TestReport } from '../reports/test-report.entity';
import { codesMatch } from '../reports/verification-code';

/** One answer for "no such number" and "wrong code", so a guess learns nothing. */
const NOT_FOUND: VerificationResult = {
  outcome: 'not-found',
  message: 'No report matches this number and verification code. Check both exactly as printed on the report.',
  report: null,
  supersededBy: null,
  revocation: null,
  file: null,
};

async function latestRevision(manager: EntityManager, report: TestReport): Promise<TestReport | null> {
  return manager.findOne(TestReport, { where: { labId: report.labId, baseNumber: report.baseNumber }, order: { revision: 'DESC' } });
}

/** What the public may know about a report once they have shown its code (or its exact file). */
async function describe(manager: EntityManager, report: TestReport, file: VerificationResult['file']): Promise<VerificationResult> {
  const facts = {
    number: report.number,
    lab: report.content.lab.name,
    issuedAt: report.issuedAt.toISOString(),
    productName: report.productName,
    sampleCode: report.sampleCode,
    verdict: report.verdict,
    followsRevoked: report.content.follows?.reportNumber ?? null,
  };
  const base = { report: facts, supersededBy: null, revocation: null, file };
  if (report.status === 'revoked') {
    return {
      ...base,
      outcome: 'revoked',
      message: `Report ${report.number} was revoked by the laboratory and must not be relied on.`,
      revocation: { reason: report.revocationReason ?? '', revokedAt: (report.revokedAt ?? report.issuedAt).toISOString() },
    };
  }
  if (report.status === 'superseded') {
    const latest = await latestRevision(manager, report);
    // a replacement that was itself revoked leaves no revision in force: "use that one" would mislead
    const message =
      latest?.status === 'revoked'
        ? `Report ${report.number} was genuine but was replaced by report ${latest.number}, which the laboratory has since revoked; no revision of this report is in force.`
        : `Report ${report.number} was genuine but has been replaced by report ${latest?.number}; use that one instead.`;
    return {
      ...base,
      outcome: 'superseded',
      message,
      supersededBy: latest?.number ?? null,
    };
  }
  return { ...base, outcome: 'valid', message: `Report ${report.number} was issued by ${facts.lab} and is in force.` };
}

async function byNumberAndCode(manager: EntityManager, number: string, code: string): Promise<TestReport | null> {
  const report = await manager.findOneBy(TestReport, { number });
  return report && codesMatch(report.verificationCode, code) ? report : null;
}

export async function verifyByCode(manager: EntityManager, number: string, code: string): Promise<VerificationResult> {
  const report = await byNumberAndCode(manager, number, code);
  return report ? describe(manager, report, null) : NOT_FOUND;
}


/**
 * Checks an uploaded file: byte-identical to an issued report (by SHA-256), or not. With the
 * number and code as well, a file that differs is named as not being the report issued under them.
 */
export async function verifyUpload(manager: EntityManager, digest: Pick<PdfDigest, 'sha256' | 'claimedNumber'>, claimed: { report?: string; code?: string }): Promise<VerificationResult> {
  const { sha256, claimedNumber: fromFile } = digest;
  const exact = await manager.findOneBy(TestReport, { sha256 });
  if (exact) return describe(manager, exact, { sha256, identical: true, claimedNumber: fromFile });
  const file = { sha256, identical: false, claimedNumber: fromFile };
  if (claimed.report && claimed.code) {
    const report = await byNumberAndCode(manager, claimed.report, claimed.code);
    if (report) {
      const result = await describe(manager, report, file);
      return {
        ...result,
        message: `This file is not the one issued as report ${report.number}: its content differs from the issued PDF, so it has been altered or is another document. ${result.message}`,
      };
    }
  }
  return {
    outcome: 'no-match',
    message:
      'This file matches no report issued through Ohmprint: it is not byte-identical to any issued PDF' +
      (fromFile ? ` (it names itself as report ${fromFile}, so it may have been altered).` : '.') +
      ' Enter the report number and verification code to check the report itself.',
    report: null,
    supersededBy: null,
    revocation: null,
    file,
  };
}
