import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** Who did what to which record, and when. Append-only. */
@Entity({ name: 'audit_event' })
export class AuditEvent {
  @PrimaryGeneratedColumn('uuid') id!: string;
  /** Null only for platform-level events that concern no lab. */
  @Column({ name: 'lab_id', type: 'uuid', nullable: true }) labId!: string | null;
  @Column({ name: 'actor_user_id', type: 'uuid', nullable: true }) actorUserId!: string | null;
  @Column({ type: 'text' }) action!: string;
  @Column({ name: 'subject_type', type: 'text' }) subjectType!: string;
  @Column({ name: 'subject_id', type: 'text', nullable: true }) subjectId!: string | null;
  @Column({ type: 'jsonb', default: () => "'{}'::jsonb" }) details!: Record<string, unknown>;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
