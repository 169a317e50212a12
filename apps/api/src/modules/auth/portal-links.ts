import { config } from '../../config';

/** Client users use the client portal at `/`; lab staff and the operator the lab portal at `/lab/`. */
export function portalLink(isClientUser: boolean, page: 'reset-password' | 'accept-invitation', token: string): string {
  const base = isClientUser ? config.publicBaseUrl : `${config.publicBaseUrl}/lab`;
  return `${base}/${page}?token=${encodeURIComponent(token)}`;
}
