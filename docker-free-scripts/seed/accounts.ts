import type { EntityManager } from 'typeorm';
import { LabRoleMembership } from '../../apps/api/src/modules/accounts/lab-role-membership.entity';
import { User } from '../../apps/api/src/modules/accounts/user.entity';
import { ClientMembership } from '../../apps/api/src/modules/client-organisations/client-membership.entity';
import { ClientOrganisation } from '../../apps/api/src/modules/client-organisations/client-organisation.entity';
import { seedLabContacts } from './lab-contact-demo';
import { Lab } from '../../apps/api/src/modules/labs/lab.entity';
import { DEMO_LABS, DEMO_OPERATOR } from './accounts-demo-data';

async function ensureUser(manager: EntityManager, labId: string | null, email: string, displayName: string, passwordHash: string): Promise<User> {
  const existing = await manager.findOne(User, { where: { email } });
  if (existing) return existing;
  return manager.save(User, manager.create(User, { labId, email, displayName, passwordHash, isPlatformOperator: labId === null }));
}

/**
 * The demo's labs, producers and accounts (all invented). Idempotent: found by name or e-mail and
 * created only when missing, so a re-run never overwrites what someone changed in the demo.
 */
export async function seedAccounts(manager: EntityManager, passwordHash: string): Promise<void> {
  await ensureUser(manager, null, DEMO_OPERATOR.email, DEMO_OPERATOR.displayName, passwordHash);
  for (const demo of DEMO_LABS) {
    let lab = await manager.findOne(Lab, { where: { name: demo.name } });
    lab ??= await manager.save(
      Lab,
      manager.create(Lab, {
        name: demo.name,
        legalName: demo.legalName,
        address: demo.address,
        accreditationBody: demo.accreditationBody,
        accreditationNumber: demo.accreditationNumber,
        turnaroundTargetDays: demo.turnaroundTargetDays,
        isDemo: true,
      }),
    );
    // Labs seeded before the mark existed get it too: their data is just as invented.
    if (!lab.isDemo) await manager.update(Lab, { id: lab.id }, { isDemo: true });
    for (const person of demo.staff) {
      const user = await ensureUser(manager, lab.id, person.email, person.displayName, passwordHash);
      for (const role of person.roles) {
        await manager.createQueryBuilder().insert().into(LabRoleMembership).values({ labId: lab.id, userId: user.id, role }).orIgnore().execute();
      }
    }
    for (const client of demo.clients) {
      let organisation = await manager.findOne(ClientOrganisation, { where: { labId: lab.id, name: client.name } });
      organisation ??= await manager.save(ClientOrganisation, manager.create(ClientOrganisation, { labId: lab.id, name: client.name, contactEmail: client.contactEmail }));
      for (const member of client.members) {
        const user = await ensureUser(manager, lab.id, member.email, member.displayName, passwordHash);
        await manager
          .createQueryBuilder()
          .insert()
          .into(ClientMembership)
          .values({ labId: lab.id, clientOrganisationId: organisation.id, userId: user.id, role: member.role })
          .orIgnore()
          .execute();
      }
    }
  }
  await seedLabContacts(manager);
}
