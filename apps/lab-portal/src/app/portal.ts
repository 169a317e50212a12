import { LAB_ROLES } from '@ohmprint/contracts';
import type { PortalConfig } from '@ohmprint/ui';

export const LAB_PORTAL: PortalConfig = {
  kind: 'lab',
  title: 'Lab portal',
  acceptedRoles: ['platform-operator', ...LAB_ROLES],
  otherPortal: { title: 'Client portal', url: '/' },
};
