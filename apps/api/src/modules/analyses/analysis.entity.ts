import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { AnalysisResult, AnalysisStatus, MethodSettings, SpectrumPoints, Verdict } from '@ohmprint/contracts';

/** A sample scored against one published library version, with everything needed to redo it. */
@Entity({ name: 'analysis' })
export class Analysis {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'sample_id', type: 'uuid' }) sampleId!: string;
  @Column({ name: 'library_version_id', type: 'uuid' }) libraryVersionId!: string;
  @Column({ type: 'text', default: 'draft' }) status!: AnalysisStatus;
  @Column({ type: 'text' }) verdict!: Verdict;
  @Column({ name: 'replicate_ids', type: 'uuid', array: true }) replicateIds!: string[];
  @Column({ type: 'jsonb' }) method!: MethodSettings;
  @Column({ name: 'engine_version', type: 'text' }) engineVersion!: string;
  @Column({ type: 'jsonb' }) result!: AnalysisResult;
  /** The averaged, normalised sample spectrum on the method grid. */
  @Column({ name: 'sample_spectrum', type: 'jsonb' }) sampleSpectrum!: SpectrumPoints;
  @Column({ type: 'text', default: '' }) remarks!: string;
  @Column({ name: 'analyst_user_id', type: 'uuid' }) analystUserId!: string;
  @Column({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
  @Column({ name: 'submitted_at', type: 'timestamptz', nullable: true }) submittedAt!: Date | null;
}
