import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A photo of a parcel or container taken at intake; kept in the database with everything else. */
@Entity({ name: 'intake_photo' })
export class IntakePhoto {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'sample_id', type: 'uuid' }) sampleId!: string;
  @Column({ name: 'file_name', type: 'text' }) fileName!: string;
  @Column({ name: 'content_type', type: 'text' }) contentType!: string;
  @Column({ name: 'size_bytes', type: 'integer' }) sizeBytes!: number;
  @Column({ type: 'bytea', select: false }) content!: Buffer;
  @Column({ name: 'uploaded_by_user_id', type: 'uuid' }) uploadedByUserId!: string;
  @Column({ name: 'uploaded_at', type: 'timestamptz' }) uploadedAt!: Date;
  /** Append order, so the photos of one upload keep the order they were sent in. */
  @Column({ name: 'entry_no', type: 'bigint', insert: false, update: false }) entryNo!: string;
}
