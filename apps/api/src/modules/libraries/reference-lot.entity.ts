import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Chemistry } from '@ohmprint/contracts';

/** An authentic lot in a library version: its normalised spectrum on the version's grid. */
@Entity({ name: 'reference_lot' })
export class ReferenceLot {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'library_version_id', type: 'uuid' }) libraryVersionId!: string;
  @Column({ name: 'lot_code', type: 'text' }) lotCode!: string;
  @Column({ name: 'produced_on', type: 'date', nullable: true }) producedOn!: string | null;
  @Column({ type: 'text', default: '' }) note!: string;
  /** The received reference-lot sample it was measured from (null for lots that came before enrolment). */
  @Column({ name: 'sample_id', type: 'uuid', nullable: true }) sampleId!: string | null;
  /** Chemistry known for the lot, in the units of CHEMISTRY_FIELDS. */
  @Column({ type: 'jsonb', default: {} }) chemistry!: Chemistry;
  /** Little-endian float64: the real parts, then the imaginary parts (see lot-spectrum-bytes.ts). */
  @Column({ type: 'bytea' }) spectrum!: Buffer;
}
