import type { EntityManager } from 'typeorm';
import { ApiError } from '../../core/api-error';
import { recordAudit } from '../audit/record-audit';
import { notifyClientOrganisation } from '../notifications/notify-client-organisation';
import { Lab } from '../labs/lab.entity';
import { ReportContent, ReportData } from './pdf/report-data';
import { VERDICT_WORDS } from './pdf/verdict-badge';
import { SCREENING_CAUTION } from './pdf/report-wording';
import { TestReport } from './test-report.entity';
import { claimReportNumber, markClaimIssued } from './report-numbering';
import { formatVerificationCode, newVerificationCode, verificationUrl } from './verification-code';
import { produceSignedReport } from './produce-signed-report';
import { stageClock } from './issuance-stages';

/** A step another feature adds to the issuing transaction, run after the report row exists. */
export type IssuanceStep = (manager: EntityManager, report: TestReport) => Promise<void>;

export interface IssueReportInput {
  labId: string;
  analysisId: string;
  sampleId: string;
  clientOrganisationId: string;
  /** The reviewer whose approval issues the report. */
  actorUserId: string;
  content: ReportContent;
  /**
   * Further work that must commit with the report or not at all, e.g. consuming the order's
   * reserved credits once billing provides that step.
   */
  steps?: IssuanceStep[];
  issuedAt?: Date;
}

/**
 * Issues a report inside the caller's transaction: number, render, sign, store with its hash,
 * audit, notify the client, then the caller's steps. Any failure throws, and the caller's
 * rollback leaves no report row, no e-mail and the analysis as it was; the number it had claimed
 * is handed to the next issuance (see `claimReportNumber`), so none is lost.
 */
export async function issueReport(manager: EntityManager, input: IssueReportInput): Promise<TestReport> {
  const lab = await manager.findOneBy(Lab, { id: input.labId });
  if (!lab) throw ApiError.notFound('The lab');
  const issuedAt = input.issuedAt ?? new Date();
  // Claimed in a moment of its own: the lab's counter is not locked while the PDF renders and signs.
  const clock = stageClock();
  clock?.lap('loadData');
  const claim = await claimReportNumber(manager, lab, issuedAt);
  clock?.lap('claimNumber');
  const number = claim.number;
  const report = await storeSignedReport(manager, lab, {
    content: input.content,
    number,
    baseNumber: number,
    revision: 0,
    replaces: null,
    issuedAt,
    actorUserId: input.actorUserId,
    analysisId: input.analysisId,
    sampleId: input.sampleId,
    clientOrganisationId: input.clientOrganisationId,
  });
  await markClaimIssued(manager, claim, report.id);
  clock?.lap('store');
  await recordAudit(manager, {
    labId: lab.id,
    actorUserId: input.actorUserId,
    action: 'report.issued',
    subjectType: 'test-report',
    subjectId: report.id,
    details: { number, analysisId: input.analysisId, sha256: report.sha256, verdict: report.verdict },
  });
  clock?.lap('audit');
  await notifyClient(manager, report, 'report-issued', {
    subject: `Test report ${number} is ready`,
    lines: [
      `Test report ${number} for sample ${report.sampleCode} (${report.productName}) has been issued by ${lab.name}.`,
      `Result: ${VERDICT_WORDS[report.verdict]}.`,
      // the e-mail states a result, so it carries the same caution as the report and the screens
      SCREENING_CAUTION,
      'Download it from your reports page in Ohmprint.',
      `Anyone holding the PDF can check it at ${verificationUrl(number, report.verificationCode)}`,
    ],
  });
  clock?.lap('notify');
  for (const step of input.steps ?? []) await step(manager, report);
  clock?.lap('credits');
  return report;
}

export interface StoreReportInput {
  content: ReportContent;
  number: string;
  baseNumber: string;
  revision: number;
  replaces: { id: string; reportNumber: string; reason: string } | null;
  issuedAt: Date;
  actorUserId: string;
  analysisId: string;
  sampleId: string;
  clientOrganisationId: string;
}

/** Renders, signs and inserts one report row (an original or a revision). */
export async function storeSignedReport(manager: EntityManager, lab: Lab, input: StoreReportInput): Promise<TestReport> {
  const code = newVerificationCode();
  const data: ReportData = {
    ...input.content,
    reportNumber: input.number,
    issuedAt: input.issuedAt.toISOString(),
    replaces: input.replaces && { reportNumber: input.replaces.reportNumber, reason: input.replaces.reason },
    verification: { code: formatVerificationCode(code), url: verificationUrl(input.number, code) },
  };
  const signed = await produceSignedReport(manager, lab, data);
  const report = manager.create(TestReport, {
    labId: lab.id,
    clientOrganisationId: input.clientOrganisationId,
    analysisId: input.analysisId,
    sampleId: input.sampleId,
    number: input.number,
    baseNumber: input.baseNumber,
    revision: input.revision,
    replacesReportId: input.replaces?.id ?? null,
    supersededByReportId: null,
    status: 'issued',
    verdict: data.results.verdict,
    sampleCode: data.sample.code,
    productName: data.sample.productName,
    issuedAt: input.issuedAt,
    issuedByUserId: input.actorUserId,
    amendmentReason: input.replaces?.reason ?? null,
    revokedAt: null,
    revokedByUserId: null,
    revocationReason: null,
    verificationCode: code,
    sha256: signed.sha256,
    pdf: signed.pdf,
    pdfSize: signed.pdf.length,
    content: data,
    signingCredentialId: signed.signingCredentialId,
  });
  return manager.save(TestReport, report);
}

/**
 * Tells the report's client organisation (e-mail and in-app, in the caller's transaction); the
 * link opens the client's reports page.
 */
export async function notifyClient(manager: EntityManager, report: TestReport, event: 'report-issued' | 'report-amended' | 'report-revoked', message: { subject: string; lines: string[] }): Promise<void> {
  await notifyClientOrganisation(manager, {
    labId: report.labId,
    clientOrganisationId: report.clientOrganisationId,
    event,
    subject: message.subject,
    text: message.lines.join('\n\n'),
    link: '/reports',
  });
}
