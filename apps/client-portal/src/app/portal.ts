import { CLIENT_ROLES } from '@ohmprint/contracts';
import type { PortalConfig } from '@ohmprint/ui';

export const CLIENT_PORTAL: PortalConfig = {
  kind: 'client',
  title: 'Client portal',
  acceptedRoles: CLIENT_ROLES,
  otherPortal: { title: 'Lab portal', url: '/lab/' },
};
