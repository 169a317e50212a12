import type { EntityManager } from 'typeorm';
import type { ClientRole, LabRole, Me, Role } from '@ohmprint/contracts';
import type { AuthContext } from './auth-context';

interface AccountRow {
  id: string;
  email: string;
  display_name: string;
  status: 'active' | 'deactivated';
  lab_id: string | null;
  is_platform_operator: boolean;
  lab_name: string | null;
  lab_status: 'active' | 'suspended' | null;
  client_organisation_id: string | null;
  client_organisation_name: string | null;
  client_role: ClientRole | null;
  lab_roles: LabRole[];
  token_version: number;
  session_ended: boolean | null;
}

export interface Account {
  auth: AuthContext;
  me: Me;
  status: 'active' | 'deactivated';
  labName: string | null;
  labStatus: 'active' | 'suspended' | null;
  /** Moves on with every password change or reset: older access tokens stop working. */
  tokenVersion: number;
  /** True when the sign-in named by `familyId` was ended (signed out, reuse detected, revoked). */
  sessionEnded: boolean;
}

const ACCOUNT_SQL = `
  SELECT u.id, u.email, u.display_name, u.status, u.lab_id, u.is_platform_operator,
         l.name AS lab_name, l.status AS lab_status,
         cm.client_organisation_id, co.name AS client_organisation_name, cm.role AS client_role,
         ARRAY(SELECT r.role FROM lab_role_membership r WHERE r.user_id = u.id AND r.lab_id = u.lab_id ORDER BY r.role) AS lab_roles,
         u.token_version,
         (SELECT bool_and(rs.revoked_at IS NOT NULL) FROM refresh_session rs WHERE rs.family_id = $2::uuid AND rs.user_id = u.id) AS session_ended
  FROM app_user u
  LEFT JOIN lab l ON l.id = u.lab_id
  LEFT JOIN client_membership cm ON cm.user_id = u.id AND cm.lab_id = u.lab_id
  LEFT JOIN client_organisation co ON co.id = cm.client_organisation_id AND co.lab_id = u.lab_id
  WHERE u.id = $1`;

/**
 * One query: the user, their lab, their roles and their client organisation, and (given the
 * sign-in's refresh family) whether that sign-in has ended.
 */
export async function loadAccount(manager: EntityManager, userId: string, familyId: string | null = null): Promise<Account | null> {
  const rows: AccountRow[] = await manager.query(ACCOUNT_SQL, [userId, familyId]);
  const row = rows[0];
  if (!row) return null;
  const roles: Role[] = row.is_platform_operator ? ['platform-operator'] : [...row.lab_roles, ...(row.client_role ? [row.client_role] : [])];
  const auth: AuthContext = {
    userId: row.id,
    email: row.email,
    displayName: row.display_name,
    labId: row.lab_id,
    roles,
    clientOrganisationId: row.client_organisation_id,
  };
  const me: Me = {
    id: row.id,
    email: row.email,
    displayName: row.display_name,
    roles,
    lab: row.lab_id && row.lab_name ? { id: row.lab_id, name: row.lab_name } : null,
    clientOrganisation: row.client_organisation_id && row.client_organisation_name ? { id: row.client_organisation_id, name: row.client_organisation_name } : null,
  };
  return { auth, me, status: row.status, labName: row.lab_name, labStatus: row.lab_status, tokenVersion: row.token_version, sessionEnded: row.session_ended === true };
}
