import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A cell constant measured with a KCl standard: K = κ_standard · R_plateau. */
@Entity({ name: 'cell_calibration' })
export class CellCalibration {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'cell_id', type: 'uuid' }) cellId!: string;
  @Column({ name: 'standard_name', type: 'text' }) standardName!: string;
  @Column({ name: 'standard_conductivity_us_per_cm', type: 'double precision' }) standardConductivityUsPerCm!: number;
  @Column({ name: 'standard_temperature_c', type: 'double precision' }) standardTemperatureC!: number;
  @Column({ name: 'plateau_resistance_ohm', type: 'double precision' }) plateauResistanceOhm!: number;
  @Column({ name: 'cell_constant_per_cm', type: 'double precision' }) cellConstantPerCm!: number;
  @Column({ name: 'measured_at', type: 'timestamptz' }) measuredAt!: Date;
  @Column({ name: 'measured_by_user_id', type: 'uuid' }) measuredByUserId!: string;
}
