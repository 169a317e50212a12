import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

export type CredentialOrigin = 'development' | 'uploaded';

/** A lab's report-signing credential, sealed at rest (see sealed-secret.ts). */
@Entity({ name: 'signing_credential' })
export class SigningCredential {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'text' }) origin!: CredentialOrigin;
  @Column({ name: 'sealed_p12', type: 'bytea' }) sealedP12!: Buffer;
  @Column({ name: 'sealed_passphrase', type: 'bytea' }) sealedPassphrase!: Buffer;
  @Column({ type: 'text' }) subject!: string;
  @Column({ type: 'text' }) issuer!: string;
  @Column({ name: 'serial_number', type: 'text' }) serialNumber!: string;
  @Column({ name: 'fingerprint_sha256', type: 'text' }) fingerprintSha256!: string;
  @Column({ name: 'not_before', type: 'timestamptz' }) notBefore!: Date;
  @Column({ name: 'not_after', type: 'timestamptz' }) notAfter!: Date;
  @Column({ name: 'uploaded_by_user_id', type: 'uuid', nullable: true }) uploadedByUserId!: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
  @Column({ name: 'retired_at', type: 'timestamptz', nullable: true }) retiredAt!: Date | null;
}
