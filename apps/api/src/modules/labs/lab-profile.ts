import type { LabProfile } from '@ohmprint/contracts';
import type { Lab } from './lab.entity';

export function toLabProfile(lab: Lab, logoSizeBytes: number | null = null): LabProfile {
  return {
    id: lab.id,
    name: lab.name,
    legalName: lab.legalName,
    address: lab.address,
    accreditationBody: lab.accreditationBody,
    accreditationNumber: lab.accreditationNumber,
    turnaroundTargetDays: lab.turnaroundTargetDays,
    contactEmail: lab.contactEmail,
    contactPhone: lab.contactPhone,
    shippingAddress: lab.shippingAddress,
    shippingInstructions: lab.shippingInstructions,
    logo:
      lab.logoContentType && lab.logoUpdatedAt
        ? { contentType: lab.logoContentType, sizeBytes: logoSizeBytes ?? 0, widthPx: lab.logoWidthPx ?? 0, heightPx: lab.logoHeightPx ?? 0, updatedAt: lab.logoUpdatedAt.toISOString() }
        : null,
    status: lab.status,
    updatedAt: lab.updatedAt.toISOString(),
  };
}
