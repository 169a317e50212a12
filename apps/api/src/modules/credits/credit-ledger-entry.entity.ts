import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

export type CreditMovementKind = 'purchase' | 'reserve' | 'release' | 'consume' | 'refund' | 'adjustment';

/** One movement of credits (append-only: a trigger refuses UPDATE and DELETE). */
@Entity({ name: 'credit_ledger_entry' })
export class CreditLedgerEntry {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'entry_no', type: 'bigint', insert: false, update: false }) entryNo!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ type: 'text' }) kind!: CreditMovementKind;
  @Column({ name: 'available_change', type: 'integer' }) availableChange!: number;
  @Column({ name: 'reserved_change', type: 'integer' }) reservedChange!: number;
  @Column({ name: 'available_after', type: 'integer' }) availableAfter!: number;
  @Column({ name: 'reserved_after', type: 'integer' }) reservedAfter!: number;
  @Column({ type: 'text' }) reason!: string;
  @Column({ name: 'order_id', type: 'uuid', nullable: true }) orderId!: string | null;
  @Column({ name: 'sample_id', type: 'uuid', nullable: true }) sampleId!: string | null;
  @Column({ name: 'payment_id', type: 'uuid', nullable: true }) paymentId!: string | null;
  @Column({ name: 'actor_user_id', type: 'uuid', nullable: true }) actorUserId!: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
