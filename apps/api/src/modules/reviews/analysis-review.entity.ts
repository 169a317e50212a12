import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A reviewer's decision on an analysis; an approval names the report it issued. */
@Entity({ name: 'analysis_review' })
export class AnalysisReview {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'analysis_id', type: 'uuid' }) analysisId!: string;
  @Column({ name: 'reviewer_user_id', type: 'uuid' }) reviewerUserId!: string;
  @Column({ type: 'text' }) decision!: 'approved' | 'returned';
  @Column({ type: 'text', default: '' }) comments!: string;
  @Column({ name: 'report_id', type: 'uuid', nullable: true }) reportId!: string | null;
  @Column({ name: 'decided_at', type: 'timestamptz' }) decidedAt!: Date;
}
