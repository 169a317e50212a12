import type { ClientRole, LabRole } from '@ohmprint/contracts';

/** Every demo account shares this password (invented demo; printed by npm start). */
export const DEMO_PASSWORD = 'ohmprint-demo-2026';

export interface DemoLab {
  key: 'calder' | 'marlow';
  name: string;
  legalName: string;
  address: string;
  accreditationBody: string;
  accreditationNumber: string;
  turnaroundTargetDays: number;
  staff: { email: string; displayName: string; roles: LabRole[] }[];
  clients: { name: string; contactEmail: string; members: { email: string; displayName: string; role: ClientRole }[] }[];
}

export const DEMO_OPERATOR = { email: 'operator@ohmprint.test', displayName: 'Platform Operator (demo)' };

/** Invented labs, producers and people for the demo and the tests; no real organisation or person. */
export const DEMO_LABS: DemoLab[] = [
  {
    key: 'calder',
    name: 'Calder Analytical',
    legalName: 'Calder Analytical Ltd (demo)',
    address: '4 Millrace Yard, Calderbrook, Demoshire DM1 4CA (invented address)',
    accreditationBody: 'Demo Accreditation Service',
    accreditationNumber: 'DEMO-17025-0412',
    turnaroundTargetDays: 7,
    staff: [
      { email: 'admin@calder.test', displayName: 'Alex Calder-Admin (demo)', roles: ['lab-admin'] },
      { email: 'intake@calder.test', displayName: 'Ira Intake (demo)', roles: ['intake-technician'] },
      { email: 'analyst@calder.test', displayName: 'Ana Lyst (demo)', roles: ['analyst'] },
      { email: 'reviewer@calder.test', displayName: 'Rae Viewer (demo)', roles: ['reviewer'] },
    ],
    clients: [
      {
        name: 'Hollin Ridge Cellars',
        contactEmail: 'admin@hollinridge.test',
        members: [
          { email: 'admin@hollinridge.test', displayName: 'Holly Ridge (demo)', role: 'client-admin' },
          { email: 'member@hollinridge.test', displayName: 'Hal Cellarman (demo)', role: 'client-member' },
        ],
      },
      {
        name: 'Brightwater Dairy Cooperative',
        contactEmail: 'admin@brightwater.test',
        members: [
          { email: 'admin@brightwater.test', displayName: 'Bree Waters (demo)', role: 'client-admin' },
          { email: 'member@brightwater.test', displayName: 'Dale Dairy (demo)', role: 'client-member' },
        ],
      },
      {
        name: 'Sunvale Juice Works',
        contactEmail: 'admin@sunvale.test',
        members: [
          { email: 'admin@sunvale.test', displayName: 'Sunny Vale (demo)', role: 'client-admin' },
          { email: 'member@sunvale.test', displayName: 'Jude Presser (demo)', role: 'client-member' },
        ],
      },
    ],
  },
  {
    key: 'marlow',
    name: 'Marlow Test House',
    legalName: 'Marlow Test House LLP (demo)',
    address: '12 Weir Lane, Marlow Green, Demoshire DM9 2MT (invented address)',
    accreditationBody: 'Demo Accreditation Service',
    accreditationNumber: 'DEMO-17025-0977',
    turnaroundTargetDays: 10,
    staff: [
      { email: 'admin@marlow.test', displayName: 'Morgan Marlow-Admin (demo)', roles: ['lab-admin'] },
      { email: 'intake@marlow.test', displayName: 'Mika Intake (demo)', roles: ['intake-technician'] },
      { email: 'analyst@marlow.test', displayName: 'Max Analyst (demo)', roles: ['analyst'] },
      { email: 'reviewer@marlow.test', displayName: 'Remy Reviewer (demo)', roles: ['reviewer'] },
    ],
    clients: [
      {
        name: 'Greyfield Preserves',
        contactEmail: 'admin@greyfield.test',
        members: [
          { email: 'admin@greyfield.test', displayName: 'Grey Fielding (demo)', role: 'client-admin' },
          { email: 'member@greyfield.test', displayName: 'Pat Preserver (demo)', role: 'client-member' },
        ],
      },
    ],
  },
];
