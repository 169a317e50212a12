import { DEMO_LABS, DEMO_OPERATOR, DEMO_PASSWORD } from './accounts-demo-data';

/** The table npm start prints: role, e-mail, portal URL, password (invented demo accounts). */
export function demoAccountsTable(baseUrl: string): string {
  const rows: [string, string, string][] = [['platform operator', DEMO_OPERATOR.email, `${baseUrl}/lab/`]];
  for (const lab of DEMO_LABS) {
    for (const person of lab.staff) rows.push([`${person.roles.join(', ')} — ${lab.name}`, person.email, `${baseUrl}/lab/`]);
    for (const client of lab.clients) {
      for (const member of client.members) rows.push([`${member.role} — ${client.name} (client of ${lab.name})`, member.email, `${baseUrl}/`]);
    }
  }
  const width = rows.reduce((w, r) => [Math.max(w[0], r[0].length), Math.max(w[1], r[1].length)], [4, 6]);
  const line = (r: [string, string, string]) => `  ${r[0].padEnd(width[0])}  ${r[1].padEnd(width[1])}  ${r[2]}`;
  return [
    `  Demo accounts (invented, for demonstration only) — password for every account: ${DEMO_PASSWORD}`,
    '',
    line(['role', 'e-mail', 'portal']),
    ...rows.map(line),
    '',
  ].join('\n');
}
