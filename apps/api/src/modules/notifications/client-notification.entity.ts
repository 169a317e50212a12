import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { NotificationEvent } from '@ohmprint/contracts';

/** One in-app notification for one client user; written in the transaction of the event it tells of. */
@Entity({ name: 'client_notification' })
export class ClientNotificationRow {
  @PrimaryGeneratedColumn('uuid') id!: string;
  /** Insertion order, to break ties between rows written in one transaction (same `now()`). */
  @Column({ name: 'entry_no', type: 'bigint', insert: false, update: false }) entryNo!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ name: 'user_id', type: 'uuid' }) userId!: string;
  @Column({ type: 'text' }) event!: NotificationEvent;
  @Column({ type: 'text' }) subject!: string;
  @Column({ type: 'text' }) body!: string;
  @Column({ type: 'text', nullable: true }) link!: string | null;
  @Column({ name: 'read_at', type: 'timestamptz', nullable: true }) readAt!: Date | null;
  @Column({ name: 'created_at', type: 'timestamptz', insert: false, update: false }) createdAt!: Date;
}
