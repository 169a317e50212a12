import { rolesInWords } from '@ohmprint/contracts';
import { DEMO_LABS, DEMO_OPERATOR, DEMO_PASSWORD } from './accounts-demo-data';

/** The table npm start prints: role, e-mail, portal URL, password (invented demo accounts). */
export function demoAccountsTable(baseUrl: string): string {
  const rows: [string, string, string][] = [['platform operator', DEMO_OPERATOR.email, `${baseUrl}/lab/`]];
  for (const lab of DEMO_LABS) {
    for (const person of lab.staff) rows.push([`${rolesInWords(person.roles)} — ${lab.name}`, person.email, `${baseUrl}/lab/`]);
    for (const client of lab.clients) {
      for (const member of client.members) rows.push([`${rolesInWords([member.role])} — ${client.name} (client of ${lab.name})`, member.email, `${baseUrl}/`]);
    }
  }
  const width = rows.reduce((w, r) => [Math.max(w[0], r[0].length), Math.max(w[1], r[1].length), Math.max(w[2], r[2].length)], [4, 6, 6]);
  const line = (r: [string, string, string], password = DEMO_PASSWORD) => `  ${r[0].padEnd(width[0])}  ${r[1].padEnd(width[1])}  ${r[2].padEnd(width[2])}  ${password}`;
  return [
    '  Demo accounts (invented, for demonstration only)',
    '',
    line(['role', 'e-mail', 'portal'], 'password'),
    ...rows.map((r) => line(r)),
    '',
  ].join('\n');
}
