import type { EntityManager } from 'typeorm';

/** Who hears about a client's reports: its contact address and every active client admin. */
export async function clientRecipients(manager: EntityManager, labId: string, clientOrganisationId: string): Promise<string[]> {
  const rows: Array<{ email: string | null }> = await manager.query(
    `SELECT contact_email AS email FROM client_organisation WHERE lab_id = $1 AND id = $2
     UNION
     SELECT u.email FROM client_membership m JOIN app_user u ON u.id = m.user_id
      WHERE m.lab_id = $1 AND m.client_organisation_id = $2 AND m.role = 'client-admin' AND u.status = 'active'`,
    [labId, clientOrganisationId],
  );
  return [...new Set(rows.map((r) => r.email).filter((e): e is string => !!e))].sort();
}
