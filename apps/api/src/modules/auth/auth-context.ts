import type { Me, Role } from '@ohmprint/contracts';

/** Who is calling, loaded fresh from the database on every request (roles and status apply at once). */
export interface AuthContext {
  userId: string;
  email: string;
  displayName: string;
  labId: string | null;
  roles: Role[];
  clientOrganisationId: string | null;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      auth: AuthContext;
      me: Me;
    }
  }
}
