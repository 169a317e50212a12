import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One refresh token of a sign-in. Each refresh rotates it: the old row is marked rotated and a new
 * one joins the same family, so presenting a rotated token again exposes a stolen copy.
 */
@Entity({ name: 'refresh_session' })
export class RefreshSession {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid', nullable: true }) labId!: string | null;
  @Column({ name: 'user_id', type: 'uuid' }) userId!: string;
  @Column({ name: 'family_id', type: 'uuid' }) familyId!: string;
  @Column({ name: 'token_hash', type: 'text' }) tokenHash!: string;
  @Column({ name: 'expires_at', type: 'timestamptz' }) expiresAt!: Date;
  @Column({ name: 'rotated_at', type: 'timestamptz', nullable: true }) rotatedAt!: Date | null;
  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true }) revokedAt!: Date | null;
  @Column({ name: 'revoked_reason', type: 'text', nullable: true }) revokedReason!: string | null;
  @Column({ name: 'user_agent', type: 'text', nullable: true }) userAgent!: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
