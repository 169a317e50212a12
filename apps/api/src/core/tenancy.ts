import type { AuthContext } from '../modules/auth/auth-context';
import { ApiError } from './api-error';

/**
 * The tenant every query is scoped by: always the signed-in user's lab, never a URL or body value.
 * The platform operator belongs to no lab, so lab data is out of reach for them by construction.
 */
export function labIdOf(auth: AuthContext): string {
  if (!auth.labId) throw ApiError.forbidden('This needs a lab account; the platform operator sees no lab data.');
  return auth.labId;
}

/** A client user's own organisation, the further scope for everything they see. */
export function clientOrganisationIdOf(auth: AuthContext): string {
  if (!auth.clientOrganisationId) throw ApiError.forbidden('This needs a client organisation account.');
  return auth.clientOrganisationId;
}
