import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { CellConstantSource, DeclaredExport, KramersKronigSummary, TemperatureSource } from '@ohmprint/contracts';

/** One instrument export of a sample: the raw file as uploaded and the spectrum read from it. */
@Entity({ name: 'replicate' })
export class Replicate {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'sample_id', type: 'uuid' }) sampleId!: string;
  @Column({ name: 'replicate_number', type: 'integer' }) replicateNumber!: number;
  @Column({ name: 'file_name', type: 'text' }) fileName!: string;
  @Column({ name: 'raw_file', type: 'bytea', select: false }) rawFile!: Buffer;
  @Column({ name: 'frequency_hz', type: 'double precision', array: true }) frequencyHz!: number[];
  @Column({ type: 'double precision', array: true }) re!: number[];
  @Column({ type: 'double precision', array: true }) im!: number[];
  @Column({ name: 'instrument_id', type: 'uuid' }) instrumentId!: string;
  @Column({ name: 'cell_id', type: 'uuid' }) cellId!: string;
  @Column({ name: 'cell_constant_per_cm', type: 'double precision' }) cellConstantPerCm!: number;
  @Column({ name: 'cell_constant_source', type: 'text' }) cellConstantSource!: CellConstantSource;
  @Column({ name: 'calibration_id', type: 'uuid', nullable: true }) calibrationId!: string | null;
  @Column({ name: 'temperature_c', type: 'double precision' }) temperatureC!: number;
  @Column({ name: 'temperature_source', type: 'text', default: 'entered' }) temperatureSource!: TemperatureSource;
  /** What the export said about itself at upload; null for uploads made before it was read. */
  @Column({ type: 'jsonb', nullable: true }) declared!: DeclaredExport | null;
  @Column({ name: 'kramers_kronig', type: 'jsonb' }) kramersKronig!: KramersKronigSummary;
  @Column({ type: 'boolean', default: false }) excluded!: boolean;
  @Column({ name: 'exclusion_reason', type: 'text', nullable: true }) exclusionReason!: string | null;
  @Column({ name: 'excluded_by_user_id', type: 'uuid', nullable: true }) excludedByUserId!: string | null;
  @Column({ name: 'excluded_at', type: 'timestamptz', nullable: true }) excludedAt!: Date | null;
  @Column({ type: 'text' }) via!: 'portal' | 'instrument-key';
  @Column({ name: 'uploaded_by_user_id', type: 'uuid', nullable: true }) uploadedByUserId!: string | null;
  @Column({ name: 'instrument_key_id', type: 'uuid', nullable: true }) instrumentKeyId!: string | null;
  @Column({ name: 'uploaded_at', type: 'timestamptz' }) uploadedAt!: Date;
}
