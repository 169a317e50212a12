import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Calibration, MethodSettings } from '@ohmprint/contracts';

/** A numbered state of a library; once published, a trigger keeps it and its lots frozen. */
@Entity({ name: 'library_version' })
export class LibraryVersion {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'library_id', type: 'uuid' }) libraryId!: string;
  @Column({ type: 'integer' }) version!: number;
  @Column({ type: 'text', default: 'draft' }) status!: 'draft' | 'published' | 'retired';
  @Column({ type: 'jsonb' }) method!: MethodSettings;
  @Column({ name: 'grid_hz', type: 'double precision', array: true }) gridHz!: number[];
  @Column({ type: 'jsonb', nullable: true }) calibration!: Calibration | null;
  @Column({ name: 'engine_version', type: 'text' }) engineVersion!: string;
  @Column({ name: 'published_at', type: 'timestamptz', nullable: true }) publishedAt!: Date | null;
  @Column({ name: 'published_by_user_id', type: 'uuid', nullable: true }) publishedByUserId!: string | null;
  /** The method version it was built under (null for versions built before methods were versioned). */
  @Column({ name: 'method_version_id', type: 'uuid', nullable: true }) methodVersionId!: string | null;
  @Column({ name: 'retired_at', type: 'timestamptz', nullable: true }) retiredAt!: Date | null;
  @Column({ name: 'retired_by_user_id', type: 'uuid', nullable: true }) retiredByUserId!: string | null;
  @Column({ name: 'retirement_reason', type: 'text', nullable: true }) retirementReason!: string | null;
}
