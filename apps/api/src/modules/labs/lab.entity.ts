import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { LabStatus } from '@ohmprint/contracts';

/** The tenant: every tenant-owned row elsewhere carries this id. */
@Entity({ name: 'lab' })
export class Lab {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ name: 'legal_name', type: 'text' }) legalName!: string;
  @Column({ type: 'text' }) address!: string;
  @Column({ name: 'accreditation_body', type: 'text', nullable: true }) accreditationBody!: string | null;
  @Column({ name: 'accreditation_number', type: 'text', nullable: true }) accreditationNumber!: string | null;
  @Column({ name: 'turnaround_target_days', type: 'integer', default: 10 }) turnaroundTargetDays!: number;
  @Column({ type: 'text', default: 'active' }) status!: LabStatus;
  /** Price of one check sample, in credits. */
  @Column({ name: 'credits_per_check_sample', type: 'integer', default: 1 }) creditsPerCheckSample!: number;
  /** Price of enrolling one reference lot, in credits (0: free). */
  @Column({ name: 'credits_per_reference_lot', type: 'integer', default: 1 }) creditsPerReferenceLot!: number;
  /** Where replies to the lab's e-mails go ('' until the lab admin sets it). */
  @Column({ name: 'contact_email', type: 'text', default: '' }) contactEmail!: string;
  @Column({ name: 'contact_phone', type: 'text', default: '' }) contactPhone!: string;
  /** Where clients send samples, and how (printed in the label pack). */
  @Column({ name: 'shipping_address', type: 'text', default: '' }) shippingAddress!: string;
  @Column({ name: 'shipping_instructions', type: 'text', default: '' }) shippingInstructions!: string;
  /** The logo printed in the report header: PNG or JPEG bytes, loaded only when asked for. */
  @Column({ type: 'bytea', nullable: true, select: false }) logo!: Buffer | null;
  @Column({ name: 'logo_content_type', type: 'text', nullable: true }) logoContentType!: 'image/png' | 'image/jpeg' | null;
  @Column({ name: 'logo_width_px', type: 'integer', nullable: true }) logoWidthPx!: number | null;
  @Column({ name: 'logo_height_px', type: 'integer', nullable: true }) logoHeightPx!: number | null;
  @Column({ name: 'logo_updated_at', type: 'timestamptz', nullable: true }) logoUpdatedAt!: Date | null;
  /** Invented demo data: its reports carry the demonstration mark. */
  @Column({ name: 'is_demo', type: 'boolean', default: false }) isDemo!: boolean;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt!: Date;
}
