import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

export type UserStatus = 'active' | 'deactivated';

/**
 * A person who signs in. Lab staff and client users carry their lab's id (a client organisation
 * belongs to one lab); the platform operator has none.
 */
@Entity({ name: 'app_user' })
export class User {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid', nullable: true }) labId!: string | null;
  /** Stored lower-cased; unique across the platform. */
  @Column({ type: 'text' }) email!: string;
  @Column({ name: 'display_name', type: 'text' }) displayName!: string;
  @Column({ name: 'password_hash', type: 'text' }) passwordHash!: string;
  @Column({ name: 'is_platform_operator', type: 'boolean', default: false }) isPlatformOperator!: boolean;
  @Column({ type: 'text', default: 'active' }) status!: UserStatus;
  @Column({ name: 'last_sign_in_at', type: 'timestamptz', nullable: true }) lastSignInAt!: Date | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt!: Date;
}
