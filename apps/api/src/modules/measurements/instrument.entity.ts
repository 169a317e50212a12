import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** An impedance analyser on the lab's bench. */
@Entity({ name: 'instrument' })
export class Instrument {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text', default: '' }) model!: string;
  @Column({ name: 'serial_number', type: 'text', default: '' }) serialNumber!: string;
}
