import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { PaymentState } from '@ohmprint/contracts';

/** One checkout for one credit pack: open until paid, declined, expired; paid until refunded. */
@Entity({ name: 'payment' })
export class PaymentRow {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'receipt_no', type: 'bigint', insert: false, update: false }) receiptNo!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ name: 'credit_pack_id', type: 'uuid' }) creditPackId!: string;
  @Column({ name: 'pack_name', type: 'text' }) packName!: string;
  @Column({ type: 'integer' }) credits!: number;
  @Column({ name: 'amount_minor', type: 'bigint' }) amountMinor!: string;
  @Column({ type: 'text' }) currency!: string;
  @Column({ name: 'price_id', type: 'text' }) priceId!: string;
  @Column({ name: 'checkout_session_id', type: 'text' }) checkoutSessionId!: string;
  @Column({ name: 'payment_intent_id', type: 'text', nullable: true }) paymentIntentId!: string | null;
  @Column({ type: 'text', default: 'open' }) status!: PaymentState;
  @Column({ name: 'failure_message', type: 'text', nullable: true }) failureMessage!: string | null;
  @Column({ name: 'started_by_user_id', type: 'uuid', nullable: true }) startedByUserId!: string | null;
  @Column({ name: 'paid_at', type: 'timestamptz', nullable: true }) paidAt!: Date | null;
  @Column({ name: 'refunded_at', type: 'timestamptz', nullable: true }) refundedAt!: Date | null;
  @Column({ name: 'refunded_by_user_id', type: 'uuid', nullable: true }) refundedByUserId!: string | null;
  @Column({ name: 'refund_id', type: 'text', nullable: true }) refundId!: string | null;
  @Column({ name: 'is_demo', type: 'boolean', default: false }) isDemo!: boolean;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt!: Date;
}
