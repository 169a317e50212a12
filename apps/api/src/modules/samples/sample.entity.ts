import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { ReferenceLotDeclaration, SampleKind, SampleState } from '@ohmprint/contracts';

/** One suspect item sent for a check, known in the lab by its printed code. */
@Entity({ name: 'sample' })
export class Sample {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'order_id', type: 'uuid' }) orderId!: string;
  @Column({ type: 'text' }) code!: string;
  @Column({ type: 'text', default: 'awaiting-arrival' }) state!: SampleState;
  /** A check of a suspect item, or an authentic lot enrolled for the product's reference library. */
  @Column({ type: 'text', default: 'check' }) kind!: SampleKind;
  /** What the producer declared about an enrolled lot; null for a check. */
  @Column({ name: 'reference_lot', type: 'jsonb', nullable: true }) referenceLot!: ReferenceLotDeclaration | null;
  @Column({ name: 'obtained_where', type: 'text' }) obtainedWhere!: string;
  /** ISO date (YYYY-MM-DD). */
  @Column({ name: 'obtained_on', type: 'date' }) obtainedOn!: string;
  @Column({ name: 'label_text', type: 'text', default: '' }) labelText!: string;
  @Column({ name: 'claimed_lot', type: 'text', default: '' }) claimedLot!: string;
  @Column({ name: 'storage_location', type: 'text', nullable: true }) storageLocation!: string | null;
  @Column({ name: 'rejection_reason', type: 'text', nullable: true }) rejectionReason!: string | null;
  @Column({ name: 'received_at', type: 'timestamptz', nullable: true }) receivedAt!: Date | null;
  @Column({ name: 'state_changed_at', type: 'timestamptz' }) stateChangedAt!: Date;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
