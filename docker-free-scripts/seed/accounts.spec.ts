import { useTestApp } from '../../apps/api/src/testing';
import { hashPassword } from '../../apps/api/src/modules/auth/passwords';
import { seedAccounts } from './accounts';

const t = useTestApp();

const COUNTS = `SELECT (SELECT count(*) FROM lab) AS labs, (SELECT count(*) FROM app_user) AS users,
  (SELECT count(*) FROM lab_role_membership) AS roles, (SELECT count(*) FROM client_organisation) AS organisations,
  (SELECT count(*) FROM client_membership) AS members`;

describe('account seed', () => {
  it('holds the demo tenants and accounts of the shared contract', async () => {
    const [counts] = await t.db.query(COUNTS);
    expect(counts).toEqual({ labs: '2', users: '17', roles: '8', organisations: '4', members: '8' });
  });

  it('is idempotent and keeps what someone changed since', async () => {
    await t.db.query(`UPDATE app_user SET display_name = 'Renamed in the demo' WHERE email = 'analyst@calder.test'`);
    const hash = await hashPassword('another-password-entirely');
    await t.db.transaction((manager) => seedAccounts(manager, hash));
    await t.db.transaction((manager) => seedAccounts(manager, hash));
    const [counts] = await t.db.query(COUNTS);
    expect(counts).toEqual({ labs: '2', users: '17', roles: '8', organisations: '4', members: '8' });
    const [analyst] = await t.db.query(`SELECT display_name FROM app_user WHERE email = 'analyst@calder.test'`);
    expect(analyst.display_name).toBe('Renamed in the demo');
    expect((await t.signIn('analyst@calder.test')).body.user.displayName).toBe('Renamed in the demo');
  });
});
