import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { Matrix } from '@ohmprint/contracts';

/** A producer's product; checks of it are scored against its reference library. */
@Entity({ name: 'product' })
export class Product {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'text' }) matrix!: Matrix;
  @Column({ type: 'text', default: '' }) description!: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
