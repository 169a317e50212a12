import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Role } from '@ohmprint/contracts';

/** An e-mailed, single-use invitation; only the SHA-256 of its token is stored. */
@Entity({ name: 'invitation' })
export class Invitation {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  /** Set for client invitations; null for lab staff. */
  @Column({ name: 'client_organisation_id', type: 'uuid', nullable: true }) clientOrganisationId!: string | null;
  @Column({ type: 'text' }) email!: string;
  @Column({ name: 'display_name', type: 'text', nullable: true }) displayName!: string | null;
  @Column({ type: 'text', array: true }) roles!: Role[];
  @Column({ name: 'token_hash', type: 'text' }) tokenHash!: string;
  @Column({ name: 'invited_by_user_id', type: 'uuid', nullable: true }) invitedByUserId!: string | null;
  @Column({ name: 'expires_at', type: 'timestamptz' }) expiresAt!: Date;
  @Column({ name: 'accepted_at', type: 'timestamptz', nullable: true }) acceptedAt!: Date | null;
  @Column({ name: 'accepted_user_id', type: 'uuid', nullable: true }) acceptedUserId!: string | null;
  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true }) revokedAt!: Date | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
