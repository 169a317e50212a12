import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A bench computer's credential for posting measurements; only its SHA-256 is kept. */
@Entity({ name: 'instrument_key' })
export class InstrumentKey {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text' }) prefix!: string;
  @Column({ name: 'secret_sha256', type: 'text', select: false }) secretSha256!: string;
  @Column({ name: 'created_by_user_id', type: 'uuid' }) createdByUserId!: string;
  @Column({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
  @Column({ name: 'last_used_at', type: 'timestamptz', nullable: true }) lastUsedAt!: Date | null;
  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true }) revokedAt!: Date | null;
  @Column({ name: 'revoked_by_user_id', type: 'uuid', nullable: true }) revokedByUserId!: string | null;
}
