import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Chemistry, LotQuality } from '@ohmprint/contracts';

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
  /** The producer's own code for the lot (its reference-lot declaration), beside our `lotCode`. */
  @Column({ name: 'producer_lot_code', type: 'text', nullable: true }) producerLotCode!: string | null;
  /** Chemistry known for the lot, in the units of CHEMISTRY_FIELDS. */
  @Column({ type: 'jsonb', default: {} }) chemistry!: Chemistry;
  /** Excluded lots stay in the draft (and in the frozen version) with the reason, but take no part in calibration or analyses. */
  @Column({ type: 'boolean', default: true }) included!: boolean;
  @Column({ name: 'exclusion_reason', type: 'text', nullable: true }) exclusionReason!: string | null;
  /** Measurement quality when the lot was taken in (see LotQuality in the contracts). */
  @Column({ type: 'jsonb', default: {} }) quality!: LotQuality | Record<string, never>;
  /** Little-endian float64: the real parts, then the imaginary parts (see lot-spectrum-bytes.ts). */
  @Column({ type: 'bytea' }) spectrum!: Buffer;
}
