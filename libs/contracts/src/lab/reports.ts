import { z } from 'zod';
import { listQuery } from '../paging';
import { VerdictSchema } from './analyses';

/** Issued test reports, their amendment and revocation, signing credentials and public verification. */
export const REPORT_STATUSES = ['issued', 'superseded', 'revoked'] as const;
export const ReportStatusSchema = z.enum(REPORT_STATUSES);

/**
 * Verification codes use an alphabet without look-alikes (no 0/O, 1/I/L, U/V confusion): 30
 * symbols, 12 of them, about 59 bits, printed in groups of four.
 */
export const VERIFICATION_CODE_ALPHABET = '23456789ABCDEFGHJKMNPQRSTVWXYZ';
export const VERIFICATION_CODE_LENGTH = 12;

/** Accepts what people type: any case, spaces or hyphens between groups. */
export const VerificationCodeSchema = z
  .string()
  .trim()
  .max(40)
  .transform((v) => v.toUpperCase().replace(/[\s-]+/g, ''))
  .pipe(z.string().regex(/^[23456789ABCDEFGHJKMNPQRSTVWXYZ]{12}$/, 'must be the 12-character code printed on the report'));

export const ReportNumberSchema = z
  .string()
  .trim()
  .max(40)
  .transform((v) => v.toUpperCase())
  .pipe(z.string().regex(/^[A-Z]{2,4}[0-9]{0,3}-[0-9]{4}-[0-9]{6}(-R[0-9]{1,3})?$/, 'must be a report number like CAL-2026-000123'));

export const ReportSummarySchema = z.object({
  id: z.uuid(),
  number: z.string(),
  revision: z.number().int().min(0),
  status: ReportStatusSchema,
  verdict: VerdictSchema,
  sampleCode: z.string(),
  productName: z.string(),
  clientOrganisation: z.object({ id: z.uuid(), name: z.string() }),
  analysisId: z.uuid(),
  issuedAt: z.iso.datetime(),
  sha256: z.string(),
  pdfSize: z.number().int(),
  replacesNumber: z.string().nullable(),
  supersededByNumber: z.string().nullable(),
  amendmentReason: z.string().nullable(),
  revokedAt: z.iso.datetime().nullable(),
  revocationReason: z.string().nullable(),
});

/** What lab staff see of one report: the summary plus how to verify it. */
export const ReportDetailSchema = ReportSummarySchema.extend({
  verificationCode: z.string(),
  verificationUrl: z.string(),
  issuedBy: z.string(),
  revokedBy: z.string().nullable(),
  /** The remarks printed on this revision (an amendment starts from them). */
  remarks: z.string().nullable(),
});

export const ReportListQuerySchema = listQuery(['issuedAt', 'number', 'status'], 'desc').extend({
  status: ReportStatusSchema.optional(),
});

const reason = z.string().trim().min(5, 'must say why (at least 5 characters)').max(1000);
const optionalText = (max: number) => z.string().trim().min(1, 'must not be empty').max(max);

/** Corrections an amendment may make; results come from the approved analysis and are not edited here. */
export const ReportCorrectionsSchema = z
  .object({
    remarks: z.string().trim().max(4000).optional(),
    sample: z
      .object({
        claimedLot: optionalText(120).nullable().optional(),
        obtainedWhere: optionalText(300).nullable().optional(),
        obtainedOn: z.iso.date({ message: 'must be a date (YYYY-MM-DD)' }).nullable().optional(),
        labelText: optionalText(1000).nullable().optional(),
        conditionOnReceipt: optionalText(1000).optional(),
      })
      .strict()
      .optional(),
    client: z
      .object({
        contactName: optionalText(120).optional(),
        contactEmail: z.email({ message: 'must be an e-mail address' }).optional(),
      })
      .strict()
      .optional(),
  })
  .strict();

export const AmendReportRequestSchema = z.object({
  reason,
  corrections: ReportCorrectionsSchema.refine(
    (c) => c.remarks !== undefined || Object.keys(c.sample ?? {}).length > 0 || Object.keys(c.client ?? {}).length > 0,
    { message: 'must change at least one field' },
  ),
});

export const RevokeReportRequestSchema = z.object({ reason });

export const VerifyReportQuerySchema = z.object({
  report: ReportNumberSchema,
  code: VerificationCodeSchema,
});

/** Optional fields of the upload form: with them an altered file can be named as such. */
export const VerifyUploadFieldsSchema = z.object({
  report: ReportNumberSchema.optional(),
  code: VerificationCodeSchema.optional(),
});

export const VERIFICATION_OUTCOMES = ['valid', 'superseded', 'revoked', 'not-found', 'no-match'] as const;

export const VerificationResultSchema = z.object({
  outcome: z.enum(VERIFICATION_OUTCOMES),
  message: z.string(),
  report: z
    .object({
      number: z.string(),
      lab: z.string(),
      issuedAt: z.iso.datetime(),
      productName: z.string(),
      sampleCode: z.string(),
      verdict: VerdictSchema,
      /** The revoked report of the same sample that this one follows (a re-analysis), if any. */
      followsRevoked: z.string().nullable().optional(),
    })
    .nullable(),
  supersededBy: z.string().nullable(),
  revocation: z.object({ reason: z.string(), revokedAt: z.iso.datetime() }).nullable(),
  /** Set when a file was uploaded: its SHA-256 and whether it is byte-identical to the issued PDF. */
  file: z.object({ sha256: z.string(), identical: z.boolean(), claimedNumber: z.string().nullable() }).nullable(),
});

export const SigningCredentialSchema = z.object({
  id: z.uuid(),
  origin: z.enum(['development', 'uploaded']),
  subject: z.string(),
  issuer: z.string(),
  serialNumber: z.string(),
  fingerprintSha256: z.string(),
  notBefore: z.iso.datetime(),
  notAfter: z.iso.datetime(),
  createdAt: z.iso.datetime(),
});

export const SigningCredentialStateSchema = z.object({ credential: SigningCredentialSchema.nullable() });

export const UploadSigningCredentialFieldsSchema = z.object({
  passphrase: z.string().max(200, 'must be at most 200 characters'),
});

export type ReportStatus = z.infer<typeof ReportStatusSchema>;
export type ReportSummary = z.infer<typeof ReportSummarySchema>;
export type ReportDetail = z.infer<typeof ReportDetailSchema>;
export type ReportListQuery = z.infer<typeof ReportListQuerySchema>;
export type ReportCorrections = z.infer<typeof ReportCorrectionsSchema>;
export type AmendReportRequest = z.infer<typeof AmendReportRequestSchema>;
export type RevokeReportRequest = z.infer<typeof RevokeReportRequestSchema>;
export type VerifyReportQuery = z.infer<typeof VerifyReportQuerySchema>;
export type VerificationResult = z.infer<typeof VerificationResultSchema>;
export type SigningCredentialSummary = z.infer<typeof SigningCredentialSchema>;
export type SigningCredentialState = z.infer<typeof SigningCredentialStateSchema>;

/** What the next approval would produce: shown in the reviewer's confirmation before approving. */
export const NextIssueSchema = z.object({
  nextReportNumber: z.string(),
  credential: SigningCredentialSchema.nullable(),
  /** With no credential: development creates a self-signed one on first issue; production refuses. */
  withoutCredential: z.enum(['development-self-signed', 'refused']).nullable(),
});
export type NextIssue = z.infer<typeof NextIssueSchema>;
