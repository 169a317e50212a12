import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { MethodSettings } from '@ohmprint/contracts';

/** A lab's current method; library versions copy it when they are created. */
@Entity({ name: 'method_settings' })
export class LabMethodSettings {
  @PrimaryColumn({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'jsonb' }) settings!: MethodSettings;
  @Column({ name: 'updated_by_user_id', type: 'uuid', nullable: true }) updatedByUserId!: string | null;
  @Column({ name: 'updated_at', type: 'timestamptz' }) updatedAt!: Date;
}
