import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A conductivity cell; its constant drifts, so it is re-measured against KCl standards. */
@Entity({ name: 'measurement_cell' })
export class MeasurementCell {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ name: 'nominal_constant_per_cm', type: 'double precision' }) nominalConstantPerCm!: number;
}
