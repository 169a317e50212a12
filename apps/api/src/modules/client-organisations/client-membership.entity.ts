import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { ClientRole } from '@ohmprint/contracts';

/** A client user's place in their one organisation. */
@Entity({ name: 'client_membership' })
export class ClientMembership {
  @PrimaryGeneratedColumn('uuid') id!: string;
  @Column({ name: 'lab_id', type: 'uuid' }) labId!: string;
  @Column({ name: 'client_organisation_id', type: 'uuid' }) clientOrganisationId!: string;
  @Column({ name: 'user_id', type: 'uuid' }) userId!: string;
  @Column({ type: 'text' }) role!: ClientRole;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt!: Date;
}
