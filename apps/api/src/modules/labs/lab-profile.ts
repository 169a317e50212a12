import type { LabProfile } from '@ohmprint/contracts';
import type { Lab } from './lab.entity';

export function toLabProfile(lab: Lab): LabProfile {
  return {
    id: lab.id,
    name: lab.name,
    legalName: lab.legalName,
    address: lab.address,
    accreditationBody: lab.accreditationBody,
    accreditationNumber: lab.accreditationNumber,
    turnaroundTargetDays: lab.turnaroundTargetDays,
    status: lab.status,
    updatedAt: lab.updatedAt.toISOString(),
  };
}
