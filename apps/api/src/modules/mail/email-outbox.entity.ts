import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

export type OutboxStatus = 'pending' | 'sent' | 'failed';

/** A message waiting for (or done with) delivery; written in the caller's transaction. */
@Entity({ name: 'email_outbox' })
export class EmailOutbox {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid', nullable: true }) labId!: string | null;
  @Column({ name: 'to_address', type: 'text' }) to!: string;
  /** Where a reply goes: the lab's contact address, so no message asks for a reply nobody reads. */
  @Column({ name: 'reply_to', type: 'text', nullable: true }) replyTo!: string | null;
  @Column({ type: 'text' }) subject!: string;
  @Column({ name: 'text_body', type: 'text' }) text!: string;
  @Column({ name: 'html_body', type: 'text', nullable: true }) html!: string | null;
  @Column({ type: 'text', default: 'pending' }) status!: OutboxStatus;
  @Column({ type: 'integer', default: 0 }) attempts!: number;
  @Column({ name: 'next_attempt_at', type: 'timestamptz', default: () => 'now()' }) nextAttemptAt!: Date;
  @Column({ name: 'last_error', type: 'text', nullable: true }) lastError!: string | null;
  @Column({ name: 'sent_at', type: 'timestamptz', nullable: true }) sentAt!: Date | null;
  @Column({ name: 'message_id', type: 'text', nullable: true }) messageId!: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
