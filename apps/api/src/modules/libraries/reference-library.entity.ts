import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** The reference library of one product; its content lives in numbered versions. */
@Entity({ name: 'reference_library' })
export class ReferenceLibrary {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'product_id', type: 'uuid' }) productId!: string;
}
