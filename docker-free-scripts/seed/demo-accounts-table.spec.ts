import { demoAccountsTable } from './demo-accounts-table';

describe('the demo accounts table', () => {
  it('lists every seeded account with its role, portal and password, labelled as invented', () => {
    const table = demoAccountsTable('http://127.0.0.1:4300');
    expect(table).toContain('invented, for demonstration only');
    expect(table).toMatch(/platform operator\s+operator@ohmprint\.test\s+http:\/\/127\.0\.0\.1:4300\/lab\/\s+ohmprint-demo-2026/);
    expect(table).toMatch(/client member — Sunvale Juice Works \(client of Calder Analytical\)\s+member@sunvale\.test\s+http:\/\/127\.0\.0\.1:4300\/\s+ohmprint-demo-2026/);
    expect(table.match(/ohmprint-demo-2026/g)).toHaveLength(17);
  });
});
