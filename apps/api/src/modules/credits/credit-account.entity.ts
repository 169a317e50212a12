import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A client organisation's credits with its lab: spendable now, and held for open orders. */
@Entity({ name: 'credit_account' })
export class CreditAccount {
  @PrimaryColumn({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ type: 'integer' }) available!: number;
  @Column({ type: 'integer' }) reserved!: number;
  @Column({ name: 'updated_at', type: 'timestamptz' }) updatedAt!: Date;
}
