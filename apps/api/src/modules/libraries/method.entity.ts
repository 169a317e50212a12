import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Matrix } from '@ohmprint/contracts';

/** A lab's named method for one matrix; its settings live in numbered versions. */
@Entity({ name: 'method' })
export class Method {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text' }) matrix!: Matrix;
  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' }) createdAt!: Date;
}
