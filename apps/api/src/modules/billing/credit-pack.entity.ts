import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

/** A pack of credits a lab sells, mapped to a payment-service product and its current price. */
@Entity({ name: 'credit_pack' })
export class CreditPackRow {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'text' }) name!: string;
  @Column({ type: 'integer' }) credits!: number;
  /** Minor units (cents); bigint comes back as a string from pg. */
  @Column({ name: 'price_minor', type: 'bigint' }) priceMinor!: string;
  @Column({ type: 'text' }) currency!: string;
  @Column({ type: 'boolean', default: true }) active!: boolean;
  @Column({ name: 'payment_product_id', type: 'text', nullable: true }) paymentProductId!: string | null;
  @Column({ name: 'payment_price_id', type: 'text', nullable: true }) paymentPriceId!: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt!: Date;
}
