import { Column, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { OrderStatus } from '@ohmprint/contracts';

/** A client's order for checks of one product; credits are reserved when it is placed. */
@Entity({ name: 'test_order' })
export class TestOrder {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ name: 'product_id', type: 'uuid' }) productId!: string;
  @Column({ type: 'text', default: 'placed' }) status!: OrderStatus;
  @Column({ name: 'placed_by_user_id', type: 'uuid' }) placedByUserId!: string;
  @Column({ name: 'credits_reserved', type: 'integer', default: 0 }) creditsReserved!: number;
  @Column({ name: 'placed_at', type: 'timestamptz' }) placedAt!: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt!: Date;
}
