import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { MethodSettings } from '@ohmprint/contracts';

/**
 * One numbered state of a method. Changing a method makes a new version; a version that an
 * issued report relied on is refused any change by a trigger.
 */
@Entity({ name: 'method_version' })
export class MethodVersion {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'method_id', type: 'uuid' }) methodId!: string;
  @Column({ type: 'integer' }) version!: number;
  @Column({ type: 'jsonb' }) settings!: MethodSettings;
  @Column({ type: 'text', default: '' }) note!: string;
  @Column({ name: 'created_by_user_id', type: 'uuid', nullable: true }) createdByUserId!: string | null;
  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' }) createdAt!: Date;
}
