import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { ContainerCondition } from '@ohmprint/contracts';

/** The condition of a sample's parcel on arrival, recorded once by intake. */
@Entity({ name: 'sample_intake' })
export class SampleIntake {
  @PrimaryColumn({ name: 'sample_id', type: 'uuid' }) sampleId!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'text' }) carrier!: string;
  @Column({ name: 'tracking_number', type: 'text', default: '' }) trackingNumber!: string;
  @Column({ name: 'arrived_at', type: 'timestamptz' }) arrivedAt!: Date;
  @Column({ name: 'temperature_c', type: 'double precision' }) temperatureC!: number;
  @Column({ name: 'seal_intact', type: 'boolean' }) sealIntact!: boolean;
  @Column({ name: 'container_condition', type: 'text' }) containerCondition!: ContainerCondition;
  @Column({ name: 'volume_ml', type: 'double precision' }) volumeMl!: number;
  @Column({ type: 'text', default: '' }) notes!: string;
  @Column({ name: 'recorded_by_user_id', type: 'uuid' }) recordedByUserId!: string;
  @Column({ name: 'recorded_at', type: 'timestamptz' }) recordedAt!: Date;
}
