import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { CustodyEventKind } from '@ohmprint/contracts';

/** One link in a sample's chain of custody. Append-only: a trigger refuses UPDATE and DELETE. */
@Entity({ name: 'custody_event' })
export class CustodyEvent {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'sample_id', type: 'uuid' }) sampleId!: string;
  @Column({ type: 'text' }) kind!: CustodyEventKind;
  @Column({ type: 'text' }) location!: string;
  @Column({ type: 'text' }) reason!: string;
  @Column({ name: 'actor_user_id', type: 'uuid' }) actorUserId!: string;
  @Column({ name: 'occurred_at', type: 'timestamptz' }) occurredAt!: Date;
  @Column({ name: 'recorded_at', type: 'timestamptz' }) recordedAt!: Date;
  /** Append order, the tie-break between events of one moment; the database numbers it. */
  @Column({ name: 'entry_no', type: 'bigint', insert: false, update: false }) entryNo!: string;
}
