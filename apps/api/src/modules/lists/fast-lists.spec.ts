import request from 'supertest';
import { SEARCH_TOTAL_CAP, TOTAL_CAP, totalCapFor } from '@ohmprint/contracts';
import { useTestApp } from '../../testing';
import { signAccessToken } from '../auth/access-token';
import { cappedCount, SPARSE_MATCHES, toCappedPage } from '../../core/paging';
import { seed100x, type Seed100xTenant } from '../../../../../test/bench/seed-100x';

/**
 * Lists at scale: capped totals, deep pages, searches on both paths (few matches through the
 * trigram indexes, many through the sort index), literal search text, tenancy. A small 100×-shaped
 * tenant (2,000 samples) keeps the file quick; the 60,000-row figures are in the bench.
 */
const t = useTestApp();
let tenant: Seed100xTenant;
const bearer = (userId: string) => ({ Authorization: `Bearer ${signAccessToken(userId)}` });

beforeAll(async () => {
  tenant = await t.db.transaction((m) => seed100x(m, { samples: 2000, tag: 'YY', libraries: 2, versionsPerLibrary: 3, lotsPerVersion: 40 }));
}, 120_000);

interface Page { items: { id: string; code?: string; number?: string }[]; total: number; totalIsLowerBound?: boolean; page: number; pageSize: number }

async function allPages(path: string, userId: string, query: string): Promise<{ ids: string[]; totals: Set<number>; lowerBounds: Set<boolean>; codes: string[] }> {
  const ids: string[] = [];
  const codes: string[] = [];
  const totals = new Set<number>();
  const lowerBounds = new Set<boolean>();
  for (let page = 1; ; page++) {
    const res = await request(t.app).get(`${path}?pageSize=100&page=${page}&${query}`).set(bearer(userId)).expect(200);
    const body = res.body as Page;
    totals.add(body.total);
    lowerBounds.add(body.totalIsLowerBound === true);
    ids.push(...body.items.map((i) => i.id));
    codes.push(...body.items.map((i) => i.code ?? i.number ?? ''));
    if (body.items.length < 100) return { ids, totals, lowerBounds, codes };
  }
}

describe('capped totals', () => {
  it('counts exactly up to the cap and says "at least" past it', async () => {
    const at = (n: number, cap?: number) => cappedCount(t.db.manager, 'FROM generate_series(1, $1::int) g', [n], cap);
    const query = { sort: 'x', dir: 'asc' as const, page: 1, pageSize: 20 };
    expect(await at(0)).toEqual({ counted: 0, cap: TOTAL_CAP });
    expect(toCappedPage([], await at(TOTAL_CAP), query)).toEqual({ items: [], total: TOTAL_CAP, page: 1, pageSize: 20 });
    expect(toCappedPage([], await at(25_000), query)).toEqual({ items: [], total: TOTAL_CAP, page: 1, pageSize: 20, totalIsLowerBound: true });
    // a search counts to a thousand: exactly 1,000 is exact, 1,001 reads "1,000+"
    expect(toCappedPage([], await at(SEARCH_TOTAL_CAP, SEARCH_TOTAL_CAP), { ...query, q: 'x' })).toEqual({ items: [], total: SEARCH_TOTAL_CAP, page: 1, pageSize: 20 });
    expect(toCappedPage([], await at(SEARCH_TOTAL_CAP + 1, SEARCH_TOTAL_CAP), { ...query, q: 'x' }))
      .toEqual({ items: [], total: SEARCH_TOTAL_CAP, page: 1, pageSize: 20, totalIsLowerBound: true });
    expect(totalCapFor({ q: 'x' })).toBe(SEARCH_TOTAL_CAP);
    expect(totalCapFor({})).toBe(TOTAL_CAP);
  });

  it('the audit log answers 10,000+ past the cap and the exact number below it', async () => {
    await t.db.query(
      `INSERT INTO audit_event (lab_id, actor_user_id, action, subject_type, subject_id, created_at)
       SELECT $1, $2, 'bulk.checked', 'sample', 'bulk-' || g, now() - g * interval '1 second' FROM generate_series(1, $3::int) g`,
      [tenant.labId, tenant.users.labAdmin, TOTAL_CAP + 50],
    );
    const all = await request(t.app).get('/api/lab/audit-events').set(bearer(tenant.users.labAdmin)).expect(200);
    expect(all.body).toMatchObject({ total: TOTAL_CAP, totalIsLowerBound: true });
    expect(all.body.items).toHaveLength(20);
    const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM audit_event WHERE lab_id = $1 AND action = 'report.issued'`, [tenant.labId]);
    const some = await request(t.app).get('/api/lab/audit-events?action=report.issued').set(bearer(tenant.users.labAdmin)).expect(200);
    expect(some.body.total).toBe(n);
    expect(some.body.totalIsLowerBound).toBeUndefined();
    // a page past the end still knows the total
    const past = await request(t.app).get('/api/lab/audit-events?action=report.issued&page=999').set(bearer(tenant.users.labAdmin)).expect(200);
    expect(past.body).toMatchObject({ items: [], total: n });
  });
});

describe('deep pages', () => {
  it('the work queue pages through every sample once, oldest first, ties broken by code', async () => {
    const { ids, totals, codes } = await allPages('/api/lab/samples', tenant.users.analyst, 'sort=age&dir=desc');
    const expected: { id: string; code: string }[] = await t.db.query(
      `SELECT s.id, s.code FROM sample s JOIN test_order o ON o.id = s.order_id
       WHERE s.lab_id = $1 AND NOT (o.status = 'cancelled') ORDER BY COALESCE(s.received_at, o.placed_at) ASC, s.code ASC`,
      [tenant.labId],
    );
    expect(new Set(ids).size).toBe(ids.length);
    expect(codes).toEqual(expected.map((r) => r.code));
    expect([...totals]).toEqual([expected.length]);
    // two samples of one order share their placement time: the tie is broken the same way every time
    expect(expected.length).toBeGreaterThan(1500);
  });

  it('lab reports page by issue time with ties broken by number, and the client sees only its own', async () => {
    const lab = await allPages('/api/lab/reports', tenant.users.reviewer, 'sort=issuedAt&dir=desc');
    const expected: { number: string; client_organisation_id: string }[] = await t.db.query(
      `SELECT number, client_organisation_id FROM test_report WHERE lab_id = $1 ORDER BY issued_at DESC, number DESC`,
      [tenant.labId],
    );
    expect(lab.codes).toEqual(expected.map((r) => r.number));
    expect(new Set(lab.ids).size).toBe(lab.ids.length);
    const client = await allPages('/api/client/reports', tenant.users.clientAdmin, 'sort=issuedAt&dir=asc');
    expect(client.codes).toEqual(expected.filter((r) => r.client_organisation_id === tenant.bigClientId).map((r) => r.number).reverse());
  });

  it('analyses, orders and the ledger walk every row once', async () => {
    const analyses = await allPages('/api/lab/analyses', tenant.users.analyst, 'sort=createdAt&dir=desc');
    const [{ a }] = await t.db.query(`SELECT count(*)::int AS a FROM analysis WHERE lab_id = $1`, [tenant.labId]);
    expect(new Set(analyses.ids).size).toBe(a);
    const orders = await allPages('/api/client/orders', tenant.users.clientAdmin, 'sort=placedAt&dir=desc');
    const [{ o }] = await t.db.query(`SELECT count(*)::int AS o FROM test_order WHERE lab_id = $1 AND client_organisation_id = $2`, [tenant.labId, tenant.bigClientId]);
    expect(new Set(orders.ids).size).toBe(o);
    const ledger = await allPages('/api/client/ledger', tenant.users.clientAdmin, 'sort=entryNo&dir=asc');
    const [{ e }] = await t.db.query(`SELECT count(*)::int AS e FROM credit_ledger_entry WHERE lab_id = $1 AND client_organisation_id = $2`, [tenant.labId, tenant.bigClientId]);
    expect(new Set(ledger.ids).size).toBe(e);
    // notifications: the page's ids come from the covering index, then the rows; order kept
    const notices = await allPages('/api/client/notifications', tenant.users.clientAdmin, 'dir=desc');
    const expected: { id: string }[] = await t.db.query(
      `SELECT id FROM client_notification WHERE lab_id = $1 AND user_id = $2 ORDER BY created_at DESC, entry_no DESC`,
      [tenant.labId, tenant.users.clientAdmin],
    );
    expect(expected.length).toBeGreaterThan(200);
    expect(notices.ids).toEqual(expected.map((r) => r.id));
  });
});

describe('searches', () => {
  it('a search matching one sample and one matching most find exactly the right rows', async () => {
    const [{ code }] = await t.db.query(`SELECT code FROM sample WHERE lab_id = $1 ORDER BY code OFFSET 321 LIMIT 1`, [tenant.labId]);
    const few = await request(t.app).get(`/api/lab/samples?q=${code.toLowerCase()}`).set(bearer(tenant.users.analyst)).expect(200);
    expect(few.body.items.map((i: { code: string }) => i.code)).toEqual([code]);
    expect(few.body.total).toBe(1);

    // "demo" names every product and organisation: the broad path, walked in the queue's order,
    // past the search's count cap; "Cider" names a product of every organisation and one
    // organisation (a few hundred samples: the ids path, several pages); "Tonic 5 (demo)" one
    // small client's product
    for (const q of ['demo', 'Cider', 'Tonic 5 (demo)']) {
      const found = await allPages('/api/lab/samples', tenant.users.analyst, `q=${encodeURIComponent(q)}&sort=code&dir=asc`);
      const expected: { code: string }[] = await t.db.query(
        `SELECT s.code FROM sample s JOIN test_order o ON o.id = s.order_id JOIN product p ON p.id = o.product_id
         JOIN client_organisation co ON co.id = o.client_organisation_id
         WHERE s.lab_id = $1 AND NOT (s.state = 'awaiting-arrival' AND o.status = 'cancelled')
           AND (p.name ILIKE $2 OR co.name ILIKE $2 OR s.code ILIKE $2 OR s.claimed_lot ILIKE $2) ORDER BY s.code`,
        [tenant.labId, `%${q}%`],
      );
      if (q === 'demo') expect(expected.length).toBeGreaterThan(SEARCH_TOTAL_CAP);
      else expect(expected.length).toBeLessThan(SPARSE_MATCHES);
      if (q === 'Cider') expect(expected.length).toBeGreaterThan(200);
      expect(found.codes).toEqual(expected.map((r) => r.code));
      // the total is exact below the search's cap and "1,000+" past it, on every page
      expect([...found.totals]).toEqual([Math.min(expected.length, SEARCH_TOTAL_CAP)]);
      expect([...found.lowerBounds]).toEqual([expected.length > SEARCH_TOTAL_CAP]);
    }
  });

  it('reports, analyses, orders and the ledger find one sample by its code', async () => {
    const [r] = await t.db.query(`SELECT number, sample_code FROM test_report WHERE lab_id = $1 AND client_organisation_id = $2 ORDER BY number OFFSET 17 LIMIT 1`, [tenant.labId, tenant.bigClientId]);
    const byNumber = await request(t.app).get(`/api/lab/reports?q=${r.number}`).set(bearer(tenant.users.reviewer)).expect(200);
    expect(byNumber.body.items.map((i: { number: string }) => i.number)).toEqual([r.number]);
    const client = await request(t.app).get(`/api/client/reports?q=${r.sample_code}`).set(bearer(tenant.users.clientAdmin)).expect(200);
    expect(client.body.items.map((i: { number: string }) => i.number)).toEqual([r.number]);
    const analyses = await request(t.app).get(`/api/lab/analyses?q=${r.sample_code}`).set(bearer(tenant.users.analyst)).expect(200);
    expect(analyses.body.items.map((i: { sampleCode: string }) => i.sampleCode)).toEqual([r.sample_code]);
    const orders = await request(t.app).get(`/api/client/orders?q=${r.sample_code}`).set(bearer(tenant.users.clientAdmin)).expect(200);
    expect(orders.body.items).toHaveLength(1);
    expect(orders.body.items[0].samples.map((s: { code: string }) => s.code)).toContain(r.sample_code);
    const ledger = await request(t.app).get(`/api/client/ledger?q=${r.sample_code}`).set(bearer(tenant.users.clientAdmin)).expect(200);
    expect(ledger.body.total).toBe(1);
  });

  it('%, _ and \\ in a search match themselves', async () => {
    const lots = ['Q%Z-lot', 'Q_Z-lot', 'Q\\Z-lot', 'QxZ-lot'];
    await t.db.query(
      `UPDATE sample SET claimed_lot = ($2::text[])[k] FROM (SELECT id, row_number() OVER (ORDER BY code) AS k FROM sample WHERE lab_id = $1 ORDER BY code LIMIT 4) pick
       WHERE sample.id = pick.id`,
      [tenant.labId, lots],
    );
    for (const [q, lot] of [['Q%Z', 'Q%Z-lot'], ['Q_Z', 'Q_Z-lot'], ['Q\\Z', 'Q\\Z-lot']]) {
      const res = await request(t.app).get(`/api/lab/samples?q=${encodeURIComponent(q)}`).set(bearer(tenant.users.analyst)).expect(200);
      expect(res.body.total).toBe(1);
      const [{ claimed_lot }] = await t.db.query(`SELECT claimed_lot FROM sample WHERE id = $1`, [res.body.items[0].id]);
      expect(claimed_lot).toBe(lot);
    }
  });
});

describe('tenancy and roles', () => {
  it("another lab's staff and another organisation's admin see none of the tenant's rows", async () => {
    const [{ code }] = await t.db.query(`SELECT code FROM sample WHERE lab_id = $1 ORDER BY code LIMIT 1`, [tenant.labId]);
    const other = await request(t.app).get(`/api/lab/samples?q=${code}`).set(await t.authFor('analyst')).expect(200);
    expect(other.body).toMatchObject({ items: [], total: 0 });
    const otherReports = await request(t.app).get('/api/lab/reports?q=HMYY').set(await t.authFor('reviewer')).expect(200);
    expect(otherReports.body.total).toBe(0);
    const [small] = await t.db.query(
      `SELECT m.user_id, m.client_organisation_id FROM client_membership m WHERE m.lab_id = $1 AND m.client_organisation_id <> $2 LIMIT 1`,
      [tenant.labId, tenant.bigClientId],
    );
    const theirs = await allPages('/api/client/orders', small.user_id, 'sort=placedAt');
    const [{ n }] = await t.db.query(`SELECT count(*)::int AS n FROM test_order WHERE client_organisation_id = $1`, [small.client_organisation_id]);
    expect(theirs.ids).toHaveLength(n);
    const bigOnes: { id: string }[] = await t.db.query(`SELECT id FROM test_order WHERE client_organisation_id = $1`, [tenant.bigClientId]);
    expect(theirs.ids.filter((id) => bigOnes.some((b) => b.id === id))).toEqual([]);
  });

  it("a broad search, a medium one and a small list of another lab hold none of the tenant's rows", async () => {
    const theirs: { id: string }[] = await t.db.query(`SELECT id FROM sample WHERE lab_id = $1`, [tenant.labId]);
    const tenantIds = new Set(theirs.map((r) => r.id));
    for (const q of ['demo', 'Cider', 'OP-']) {
      const other = await request(t.app).get(`/api/lab/samples?pageSize=100&q=${q}`).set(await t.authFor('analyst')).expect(200);
      expect(other.body.items.filter((i: { id: string }) => tenantIds.has(i.id))).toEqual([]);
      if (other.body.totalIsLowerBound) expect(other.body.total).toBe(SEARCH_TOTAL_CAP);
    }
    // the other lab's staff list is counted its own way: none of the tenant's staff, exact total
    const staff = await request(t.app).get('/api/lab/staff?pageSize=100').set(await t.authFor('lab-admin')).expect(200);
    expect(staff.body.items.some((u: { email: string }) => u.email.endsWith(`@hollowmere-${tenant.tag.toLowerCase()}.test`))).toBe(false);
    expect(staff.body.total).toBe(staff.body.items.length);
  });

  it('a client cannot read lab lists and an analyst cannot read the audit log', async () => {
    await request(t.app).get('/api/lab/samples').set(bearer(tenant.users.clientAdmin)).expect(403);
    await request(t.app).get('/api/lab/audit-events').set(bearer(tenant.users.analyst)).expect(403);
  });

  it('the libraries list gives each version its included lots and thresholds', async () => {
    const res = await request(t.app).get('/api/lab/libraries').set(bearer(tenant.users.analyst)).expect(200);
    expect(res.body.total).toBe(2);
    const versions = res.body.items.flatMap((i: { versions: { lotCount: number; t95: number; t99: number; version: number }[] }) => i.versions);
    expect(versions).toHaveLength(6);
    // 40 lots a version, every 50th excluded: none of the first 40 is
    for (const v of versions) {
      expect(v.lotCount).toBe(40);
      expect(v.t95).toBeCloseTo(0.02 + v.version / 1000, 12);
      expect(v.t99).toBeCloseTo(0.03 + v.version / 1000, 12);
    }
  });
});
