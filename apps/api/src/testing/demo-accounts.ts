import type { Role } from '@ohmprint/contracts';
import { DEMO_LABS, DEMO_OPERATOR, DEMO_PASSWORD } from '../../../../docker-free-scripts/seed/accounts-demo-data';

export { DEMO_PASSWORD };

export type DemoLabKey = 'calder' | 'marlow';

/**
 * The seeded account holding `role`: in Calder Analytical by default, or in Marlow Test House (the
 * other tenant, for isolation checks). Client roles come from the lab's first client organisation.
 */
export function demoEmail(role: Role, lab: DemoLabKey = 'calder'): string {
  if (role === 'platform-operator') return DEMO_OPERATOR.email;
  const demo = DEMO_LABS.find((l) => l.key === lab);
  if (!demo) throw new Error(`no demo lab ${lab}`);
  const staff = demo.staff.find((s) => (s.roles as Role[]).includes(role));
  if (staff) return staff.email;
  const member = demo.clients[0].members.find((m) => m.role === role);
  if (member) return member.email;
  throw new Error(`no demo account with role ${role} in ${lab}`);
}
