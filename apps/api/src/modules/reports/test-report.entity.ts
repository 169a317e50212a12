import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { ReportData, ReportVerdict } from './pdf/report-data';

export type ReportStatus = 'issued' | 'superseded' | 'revoked';

/** An issued test report: the signed PDF as issued, its hash, and the content it was drawn from. */
@Entity({ name: 'test_report' })
export class TestReport {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ name: 'analysis_id', type: 'uuid' }) analysisId!: string;
  @Column({ name: 'sample_id', type: 'uuid' }) sampleId!: string;
  @Column({ type: 'text' }) number!: string;
  /** The number of the first issue; revisions append -R1, -R2… to it. */
  @Column({ name: 'base_number', type: 'text' }) baseNumber!: string;
  @Column({ type: 'integer', default: 0 }) revision!: number;
  @Column({ name: 'replaces_report_id', type: 'uuid', nullable: true }) replacesReportId!: string | null;
  @Column({ name: 'superseded_by_report_id', type: 'uuid', nullable: true }) supersededByReportId!: string | null;
  @Column({ type: 'text', default: 'issued' }) status!: ReportStatus;
  @Column({ type: 'text' }) verdict!: ReportVerdict;
  @Column({ name: 'sample_code', type: 'text' }) sampleCode!: string;
  @Column({ name: 'product_name', type: 'text' }) productName!: string;
  @Column({ name: 'issued_at', type: 'timestamptz' }) issuedAt!: Date;
  @Column({ name: 'issued_by_user_id', type: 'uuid' }) issuedByUserId!: string;
  @Column({ name: 'amendment_reason', type: 'text', nullable: true }) amendmentReason!: string | null;
  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true }) revokedAt!: Date | null;
  @Column({ name: 'revoked_by_user_id', type: 'uuid', nullable: true }) revokedByUserId!: string | null;
  @Column({ name: 'revocation_reason', type: 'text', nullable: true }) revocationReason!: string | null;
  @Column({ name: 'verification_code', type: 'text' }) verificationCode!: string;
  @Column({ type: 'text' }) sha256!: string;
  /** Loaded only for downloads and verification by upload. */
  @Column({ type: 'bytea', select: false }) pdf!: Buffer;
  @Column({ name: 'pdf_size', type: 'integer' }) pdfSize!: number;
  @Column({ type: 'jsonb' }) content!: ReportData;
  @Column({ name: 'signing_credential_id', type: 'uuid' }) signingCredentialId!: string;
}
