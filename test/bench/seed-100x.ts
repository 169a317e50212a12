/**
 * A lab with a hundred times the demo's data, for benchmarks and list tests (invented, labelled
 * "demo"): one extra tenant, "Hollowmere Test Lab (demo, 100×)", so the ordinary demo logins
 * keep working beside it. Everything is written with set-based SQL (generate_series), not
 * through the API: about half a million rows in one transaction, 2–4 minutes on the shared
 * 2-core machine (mostly foreign-key checks); `SEED100X_TIMING=1` prints each statement's time.
 *
 *   const lab = await seed100x(dataSource.manager);                   // 60,000 samples (the default)
 *   const small = await seed100x(manager, { samples: 2000, tag: 'YY' }); // a few thousand, for a test
 *
 * Idempotent: a second call with the same `tag` finds the tenant and answers its handle without
 * writing anything. To start again use a fresh database (the bench creates and drops its own):
 * custody events and ledger entries are append-only by trigger, so a tenant cannot be deleted.
 *
 * Shape (n = samples): n/2 orders of two samples each; per sample one custody event and, for the
 * samples past measuring, one analysis and (for reported ones, ~85 %) one issued report; n
 * client notifications, n audit events, n ledger entries, n/10 payments; `libraries` libraries
 * with `versionsPerLibrary` published versions of `lotsPerVersion` lots each. About 80 % of
 * the orders belong to one client organisation ("Brackenfold Cellars (demo)"), so the client
 * portal's lists are as long as the lab's.
 */
import type { EntityManager } from 'typeorm';
import { DEFAULT_METHOD } from '../../apps/api/src/modules/libraries/default-method';

export interface Seed100xOptions {
  /** samples in the tenant (orders, analyses, reports, notifications, audit and ledger rows follow) */
  samples?: number;
  /** two characters [0-9A-HJKMNP-TV-Z] ending every sample code, and naming the tenant */
  tag?: string;
  libraries?: number;
  versionsPerLibrary?: number;
  lotsPerVersion?: number;
  /** bcrypt hash for every user of the tenant; without one, sign-in is impossible (tokens still work) */
  passwordHash?: string;
}

export interface Seed100xTenant {
  labId: string;
  tag: string;
  samples: number;
  /** lab users by role, and the big client organisation's admin */
  users: { labAdmin: string; analyst: string; reviewer: string; intake: string; clientAdmin: string };
  emails: { labAdmin: string; analyst: string; reviewer: string; intake: string; clientAdmin: string };
  bigClientId: string;
}

const CODE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

/** SQL for the i-th sample code: OP-<i in 4 base-32 digits>-<tag>. */
const codeSql = (i: string, tag: string) =>
  `'OP-' || ${[3, 2, 1, 0].map((d) => `substr('${CODE_ALPHABET}', ((${i} / ${32 ** d}) % 32)::int + 1, 1)`).join(' || ')} || '-${tag}'`;

const PRODUCT_WORDS = ['Ridge', 'Marsh', 'Fen', 'Heath', 'Copse', 'Brook', 'Holt', 'Weald', 'Tarn', 'Moor'];
const PRODUCT_KINDS = ['Red', 'White', 'Cider', 'Perry', 'Verjus', 'Tonic', 'Malt', 'Brine', 'Whey', 'Shrub'];
const MATRICES = ['wine', 'milk', 'juice', 'vinegar', 'spirit', 'brine'];
const ORG_NAMES = [
  'Brackenfold Cellars', 'Coldharbour Dairy', 'Tollgate Presses', 'Quillon Vinegars', 'Saltmarsh Spirits', 'Lowfield Juices',
  'Harrowgate Creamery', 'Wyvern Cider Co', 'Dunmere Brewing', 'Ashcombe Orchards', 'Pebblewick Drinks', 'Thornbury Vineyard',
  'Eastling Brines', 'Oxley Mills', 'Farthing Cordials', 'Redlake Dairies', 'Sallow Ferments', 'Kestrel Still House',
  'Gorse Hill Wines', 'Nettlebed Presses',
];

/** The tenant's organisations numbered 0–18, the big one 19, each with its admin's user id. */
const ORGS_SQL = `SELECT o.id, m.user_id AS admin_id,
    CASE WHEN o.name = 'Brackenfold Cellars (demo)' THEN 19 ELSE row_number() OVER (PARTITION BY o.name = 'Brackenfold Cellars (demo)' ORDER BY o.name) - 1 END AS k
  FROM client_organisation o JOIN client_membership m ON m.client_organisation_id = o.id AND m.role = 'client-admin' WHERE o.lab_id = $1`;

/** Seeds (or finds) the 100× tenant. Runs inside one transaction of the caller's choosing. */
export async function seed100x(manager: EntityManager, options: Seed100xOptions = {}): Promise<Seed100xTenant> {
  const tag = options.tag ?? 'ZZ';
  if (!/^[0-9A-HJKMNP-TV-Z]{2}$/.test(tag)) throw new Error(`seed100x: tag ${tag} is not two code characters`);
  const n = Math.max(20, Math.floor(options.samples ?? 60_000));
  const libraries = options.libraries ?? 4;
  const versions = options.versionsPerLibrary ?? 12;
  const lots = options.lotsPerVersion ?? 1000;
  const hash = options.passwordHash ?? '!no-sign-in';
  const labName = `Hollowmere Test Lab ${tag} (demo, 100×)`;
  const domain = `hollowmere-${tag.toLowerCase()}.test`;
  const emails = {
    labAdmin: `admin@${domain}`,
    analyst: `analyst@${domain}`,
    reviewer: `reviewer@${domain}`,
    intake: `intake@${domain}`,
    clientAdmin: `client@brackenfold-${tag.toLowerCase()}.test`,
  };

  const existing: { id: string }[] = await manager.query(`SELECT id FROM lab WHERE lower(name) = lower($1)`, [labName]);
  if (existing.length) return handle(manager, existing[0].id, tag, emails);

  const [{ id: labId }]: { id: string }[] = await manager.query(
    `INSERT INTO lab (name, legal_name, address, turnaround_target_days, is_demo, contact_email)
     VALUES ($1, $1, '1 Invented Way, Hollowmere (demo address)', 10, true, $2) RETURNING id`,
    [labName, `desk@${domain}`],
  );
  const timing = process.env.SEED100X_TIMING === '1';
  const q = async (sql: string, params: unknown[] = []) => {
    const t0 = Date.now();
    const out = await manager.query(sql, [labId, ...params]);
    if (timing) console.log(`${Date.now() - t0} ms  ${sql.trim().slice(0, 60).replace(/\s+/g, ' ')}`);
    return out;
  };

  // People: four lab users, then one admin per client organisation and fifty extra staff.
  await q(
    `INSERT INTO app_user (lab_id, email, display_name, password_hash)
     SELECT $1, e, d, $2 FROM unnest($3::text[], $4::text[]) AS t(e, d)`,
    [hash, [emails.labAdmin, emails.analyst, emails.reviewer, emails.intake], ['Ada Hollow (demo)', 'Ben Marsh (demo)', 'Cleo Fenwick (demo)', 'Dev Intake (demo)']],
  );
  await q(
    `INSERT INTO lab_role_membership (lab_id, user_id, role)
     SELECT $1, u.id, r FROM app_user u JOIN unnest($2::text[], $3::text[]) AS t(e, r) ON t.e = u.email`,
    [[emails.labAdmin, emails.analyst, emails.reviewer, emails.intake], ['lab-admin', 'analyst', 'reviewer', 'intake-technician']],
  );
  await q(
    `WITH s AS (
       INSERT INTO app_user (lab_id, email, display_name, password_hash, created_at)
       SELECT $1, 'staff' || g || '@${domain}', 'Staff member ' || g || ' (demo)', $2, now() - g * interval '1 hour'
       FROM generate_series(1, 50) g RETURNING id)
     INSERT INTO lab_role_membership (lab_id, user_id, role) SELECT $1, id, 'analyst' FROM s`,
    [hash],
  );
  await q(
    `INSERT INTO client_organisation (lab_id, name, contact_email)
     SELECT $1, name || ' (demo)', 'orders@' || lower(replace(name, ' ', '')) || '-${tag.toLowerCase()}.test'
     FROM unnest($2::text[]) AS name`,
    [ORG_NAMES],
  );
  await q(
    `WITH o AS (SELECT id, name, row_number() OVER (ORDER BY name) AS k FROM client_organisation WHERE lab_id = $1),
     u AS (INSERT INTO app_user (lab_id, email, display_name, password_hash)
           SELECT $1, CASE WHEN o.name = 'Brackenfold Cellars (demo)' THEN $3 ELSE 'client' || o.k || '@clients-${tag.toLowerCase()}.test' END,
                  'Client admin ' || o.k || ' (demo)', $2 FROM o RETURNING id, email)
     INSERT INTO client_membership (lab_id, client_organisation_id, user_id, role)
     SELECT $1, o.id, u.id, 'client-admin' FROM o JOIN u ON u.email = CASE WHEN o.name = 'Brackenfold Cellars (demo)' THEN $3 ELSE 'client' || o.k || '@clients-${tag.toLowerCase()}.test' END`,
    [hash, emails.clientAdmin],
  );
  await q(`INSERT INTO credit_account (lab_id, client_organisation_id, available) SELECT $1, id, 1000000 FROM client_organisation WHERE lab_id = $1`);

  // Products: ten per organisation.
  await q(
    `INSERT INTO product (lab_id, client_organisation_id, name, matrix, description)
     SELECT $1, o.id, w.word || ' ' || k.kind || ' ' || o.k || ' (demo)', ($2::text[])[1 + (o.k + k.i) % ${MATRICES.length}], 'Invented product for the 100× demo'
     FROM (SELECT id, row_number() OVER (ORDER BY name) AS k FROM client_organisation WHERE lab_id = $1) o
     CROSS JOIN unnest($3::text[]) WITH ORDINALITY AS k(kind, i)
     JOIN unnest($4::text[]) WITH ORDINALITY AS w(word, j) ON w.j = k.i`,
    [MATRICES, PRODUCT_KINDS, PRODUCT_WORDS],
  );

  // Orders: n/2, 80 % for the big client; the i-th order placed i minutes before "now".
  const orders = Math.ceil(n / 2);
  await q(
    `WITH prod AS (SELECT id, client_organisation_id, row_number() OVER (PARTITION BY client_organisation_id ORDER BY name) - 1 AS k FROM product WHERE lab_id = $1)
     INSERT INTO test_order (lab_id, client_organisation_id, product_id, status, placed_by_user_id, credits_reserved, placed_at, kind)
     SELECT $1, c.id, p.id, CASE WHEN g % 50 = 0 THEN 'cancelled' WHEN g % 3 = 0 THEN 'completed' ELSE 'in-progress' END,
            c.admin_id, 2, now() - g * interval '1 minute', 'check'
     FROM generate_series(1, $2::int) g
     JOIN (${ORGS_SQL}) c ON c.k = CASE WHEN g % 5 = 0 THEN (g / 5) % 19 ELSE 19 END
     JOIN prod p ON p.client_organisation_id = c.id AND p.k = g % 10`,
    [orders],
  );

  // Samples: two per order, codes OP-xxxx-<tag>; states spread across the workflow.
  await q(
    `WITH o AS (SELECT id, placed_at, status, row_number() OVER (ORDER BY placed_at DESC, id) AS k FROM test_order WHERE lab_id = $1)
     INSERT INTO sample (lab_id, order_id, code, state, obtained_where, obtained_on, label_text, claimed_lot, received_at, state_changed_at,
                         created_at, kind, credits, credit_state)
     SELECT $1, o.id, ${codeSql('i', tag)},
            CASE WHEN o.status = 'cancelled' THEN 'awaiting-arrival'
                 ELSE CASE i % 20 WHEN 0 THEN 'awaiting-arrival' WHEN 1 THEN 'received' WHEN 2 THEN 'measuring' WHEN 3 THEN 'in-review' ELSE 'reported' END END,
            'Invented shop ' || (i % 97) || ' (demo)', (o.placed_at - interval '3 days')::date,
            'Label ' || i || ' (demo)', 'LOT-' || lpad((i % 5000)::text, 5, '0'),
            CASE WHEN i % 20 = 0 OR o.status = 'cancelled' THEN NULL ELSE o.placed_at + interval '2 days' END,
            o.placed_at, o.placed_at, 'check', 1, CASE WHEN i % 20 >= 4 THEN 'consumed' ELSE 'reserved' END
     FROM o CROSS JOIN LATERAL (SELECT (o.k - 1) * 2 + s AS i FROM generate_series(0, 1) s) x
     WHERE i < $2`,
    [n],
  );

  await q(
    `INSERT INTO custody_event (lab_id, sample_id, kind, location, reason, actor_user_id, occurred_at)
     SELECT $1, s.id, 'received', 'Intake bench (demo)', 'Arrived by courier (demo)', (SELECT id FROM app_user WHERE email = $2), s.received_at
     FROM sample s WHERE s.lab_id = $1 AND s.received_at IS NOT NULL`,
    [emails.intake],
  );

  // Libraries: one per product of the first `libraries` products, versions published, lots in each.
  const calibration = (k: number) =>
    JSON.stringify({ lowerThreshold: 0.02 + k / 1000, upperThreshold: 0.03 + k / 1000, lotCount: lots, thresholdEstimator: 'lognormal-ml',
      nearestDistances: Array.from({ length: lots }, (_, i) => 0.01 + ((i * 7919) % 1000) / 50_000) });
  await q(
    `INSERT INTO reference_library (lab_id, product_id)
     SELECT $1, id FROM product WHERE lab_id = $1 ORDER BY name LIMIT $2`,
    [libraries],
  );
  const libs: { id: string }[] = await q(`SELECT id FROM reference_library WHERE lab_id = $1 ORDER BY id`);
  const analyst = `(SELECT id FROM app_user WHERE email = '${emails.analyst}')`;
  for (const lib of libs) {
    for (let v = 1; v <= versions; v++) {
      const [{ id: versionId }]: { id: string }[] = await q(
        `INSERT INTO library_version (lab_id, library_id, version, status, method, grid_hz, engine_version)
         VALUES ($1, $2, $3, 'draft', $4::jsonb, ARRAY[100, 1000, 10000, 100000]::float8[], 'demo-100x') RETURNING id`,
        [lib.id, v, JSON.stringify(DEFAULT_METHOD)],
      );
      await q(
        `INSERT INTO reference_lot (lab_id, library_version_id, lot_code, produced_on, note, spectrum, included, exclusion_reason)
         SELECT $1, $2, 'L' || lpad(g::text, 6, '0'), DATE '2025-01-01' + (g % 365), 'Invented lot (demo)', '\\x00000000'::bytea,
                g % 50 <> 0, CASE WHEN g % 50 = 0 THEN 'Outside the quality limits (demo)' END
         FROM generate_series(1, $3::int) g`,
        [versionId, lots],
      );
      await q(
        `UPDATE library_version SET status = 'published', calibration = $3::jsonb, published_at = now() - ($4::int * interval '1 day'),
                published_by_user_id = ${analyst} WHERE lab_id = $1 AND id = $2`,
        [versionId, calibration(v), versions - v],
      );
    }
  }

  // Analyses for samples past measuring, reports for the reported ones.
  await q(
    `INSERT INTO analysis (lab_id, sample_id, library_version_id, status, verdict, replicate_ids, method, engine_version, result, sample_spectrum,
                           analyst_user_id, created_at, submitted_at)
     SELECT $1, s.id, (SELECT id FROM library_version WHERE lab_id = $1 ORDER BY version DESC, id LIMIT 1),
            CASE WHEN s.state = 'reported' THEN 'approved' ELSE 'submitted' END,
            (ARRAY['consistent','consistent','consistent','inconclusive','not-consistent'])[1 + (hashtext(s.code) & 1023) % 5],
            '{}'::uuid[], '{}'::jsonb, 'demo-100x', '{}'::jsonb, '{}'::jsonb, ${analyst},
            s.received_at + interval '1 day', s.received_at + interval '1 day 1 hour'
     FROM sample s WHERE s.lab_id = $1 AND s.state IN ('in-review', 'reported')`,
  );
  await q(
    `INSERT INTO signing_credential (lab_id, origin, sealed_p12, sealed_passphrase, subject, issuer, serial_number, fingerprint_sha256, not_before, not_after)
     VALUES ($1, 'development', '\\x00'::bytea, '\\x00'::bytea, 'CN=Hollowmere demo', 'CN=Hollowmere demo', '01', repeat('0', 64), now() - interval '1 year', now() + interval '1 year')`,
  );
  await q(
    `INSERT INTO test_report (lab_id, client_organisation_id, analysis_id, sample_id, number, base_number, status, verdict, sample_code, product_name,
                              issued_at, issued_by_user_id, verification_code, sha256, pdf, pdf_size, content, signing_credential_id)
     SELECT $1, t.client_organisation_id, t.analysis_id, t.sample_id, t.num, t.num, 'issued', t.verdict, t.code, t.product_name,
            t.submitted_at + interval '1 hour', (SELECT id FROM app_user WHERE email = $2), md5(t.code), encode(sha256(convert_to(t.code, 'UTF8')), 'hex'),
            '\\x255044462d64656d6f'::bytea, 9, '{"remarks": "Invented report for the 100x demo"}'::jsonb, (SELECT id FROM signing_credential WHERE lab_id = $1)
     FROM (SELECT o.client_organisation_id, a.id AS analysis_id, s.id AS sample_id, a.verdict, s.code, p.name AS product_name, a.submitted_at,
                  'HM${tag}-2026-' || lpad((row_number() OVER (ORDER BY a.submitted_at, s.code))::text, 6, '0') AS num
           FROM analysis a JOIN sample s ON s.id = a.sample_id JOIN test_order o ON o.id = s.order_id JOIN product p ON p.id = o.product_id
           WHERE a.lab_id = $1 AND a.status = 'approved') t`,
    [emails.reviewer],
  );

  // Notifications, audit events, ledger entries and payments: n each (payments n/10).
  await q(
    `INSERT INTO client_notification (lab_id, client_organisation_id, user_id, event, subject, body, link, read_at, created_at)
     SELECT $1, s.client_organisation_id, m.user_id, 'report-issued', 'Report ' || s.number || ' issued (demo)', 'Invented notice (demo)',
            '/reports', CASE WHEN s.k % 3 = 0 THEN NULL ELSE s.issued_at END, s.issued_at
     FROM (SELECT r.client_organisation_id, r.number, r.issued_at, row_number() OVER (ORDER BY r.issued_at, r.number) AS k FROM test_report r WHERE r.lab_id = $1) s
     JOIN client_membership m ON m.client_organisation_id = s.client_organisation_id AND m.role = 'client-admin'`,
  );
  await q(
    `INSERT INTO audit_event (lab_id, actor_user_id, action, subject_type, subject_id, details, created_at)
     SELECT $1, u.id, (ARRAY['sample.received','sample.accepted','analysis.submitted','report.issued','order.placed'])[1 + g % 5],
            (ARRAY['sample','sample','analysis','report','order'])[1 + g % 5], 'demo-' || g, jsonb_build_object('demo', true, 'n', g),
            now() - g * interval '30 seconds'
     FROM generate_series(1, $2::int) g CROSS JOIN LATERAL (SELECT id FROM app_user WHERE lab_id = $1 ORDER BY email LIMIT 1 OFFSET g % 4) u`,
    [n],
  );
  await q(
    `INSERT INTO credit_pack (lab_id, name, credits, price_minor, currency) VALUES ($1, 'Demo pack of 500', 500, 50000, 'eur')`,
  );
  await q(
    `INSERT INTO payment (lab_id, client_organisation_id, credit_pack_id, pack_name, credits, amount_minor, currency, price_id, checkout_session_id,
                          status, started_by_user_id, paid_at, is_demo, created_at)
     SELECT $1, c.id, (SELECT id FROM credit_pack WHERE lab_id = $1), 'Demo pack of 500', 500, 50000, 'eur', 'price_demo',
            'cs_demo_${tag.toLowerCase()}_' || g, 'paid', c.admin_id, now() - g * interval '2 hours', true, now() - g * interval '2 hours'
     FROM generate_series(1, $2::int) g
     JOIN (${ORGS_SQL}) c ON c.k = CASE WHEN g % 5 = 0 THEN (g / 5) % 19 ELSE 19 END`,
    [Math.ceil(n / 10)],
  );
  await q(
    `INSERT INTO credit_ledger_entry (lab_id, client_organisation_id, kind, available_change, reserved_change, available_after, reserved_after, reason,
                                      order_id, sample_id, actor_user_id, created_at)
     SELECT $1, o.client_organisation_id, 'reserve', -1, 1, 1000000, 1, 'Reserved for sample ' || s.code || ' (demo)', o.id, s.id, o.placed_by_user_id, s.created_at
     FROM sample s JOIN test_order o ON o.id = s.order_id WHERE s.lab_id = $1`,
  );
  await manager.query('ANALYZE');
  return handle(manager, labId, tag, emails);
}

async function handle(manager: EntityManager, labId: string, tag: string, emails: Seed100xTenant['emails']): Promise<Seed100xTenant> {
  const rows: { email: string; id: string }[] = await manager.query(`SELECT email, id FROM app_user WHERE email = ANY($1::text[])`, [Object.values(emails)]);
  const id = (e: string) => rows.find((r) => r.email === e)!.id;
  const [{ n }]: { n: number }[] = await manager.query(`SELECT count(*)::int AS n FROM sample WHERE lab_id = $1`, [labId]);
  const [{ big }]: { big: string }[] = await manager.query(`SELECT id AS big FROM client_organisation WHERE lab_id = $1 AND name = 'Brackenfold Cellars (demo)'`, [labId]);
  return {
    labId,
    tag,
    samples: n,
    users: { labAdmin: id(emails.labAdmin), analyst: id(emails.analyst), reviewer: id(emails.reviewer), intake: id(emails.intake), clientAdmin: id(emails.clientAdmin) },
    emails,
    bigClientId: big,
  };
}

/**
 * `npx tsx test/bench/seed-100x.ts [database]` seeds the 100× tenant into a migrated database
 * (default: the local `ohmprint` that `npm start` serves), with the demo password for its users.
 */
async function cli(): Promise<void> {
  if (process.argv[2]) process.env.DATABASE_NAME = process.argv[2];
  const { dataSource } = await import('../../apps/api/src/db/data-source');
  const { hashPassword } = await import('../../apps/api/src/modules/auth/passwords');
  const { DEMO_PASSWORD } = await import('../../docker-free-scripts/seed/accounts-demo-data');
  await dataSource.initialize();
  try {
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const started = Date.now();
    const tenant = await dataSource.transaction((m) => seed100x(m, { passwordHash }));
    console.log(JSON.stringify({ seeded: tenant.labId, samples: tenant.samples, emails: tenant.emails, seconds: (Date.now() - started) / 1000 }));
  } finally {
    await dataSource.destroy();
    await (await import('../../apps/api/src/core/cpu-pool/cpu-pool')).closeCpuPool();
  }
}

if (process.argv[1]?.replace(/\\/g, '/').endsWith('test/bench/seed-100x.ts')) {
  cli().catch((err) => {
    console.error(err);
    process.exitCode = 1;
  });
}
