import { execFileSync } from 'node:child_process';
import { generateKeyPairSync, randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import forge from 'node-forge';
import request from 'supertest';
import { LAB_LOGO_MAX_BYTES } from '@ohmprint/contracts';
import { useTestApp } from '../../testing';
import { demoReportContent } from '../reports/pdf/demo-report-content';
import { issueReport } from '../reports/issue-report';
import { insertSubmittedAnalysis } from '../reports/submitted-analysis.fixture';
import { MAX_PKCS12_ITERATIONS } from '../reports/signing/pkcs12-iterations';

// Key generation, PKCS#12 packing and report signing take seconds on a busy two-core machine.
jest.setTimeout(90_000);
const t = useTestApp();
const dir = mkdtempSync(join(tmpdir(), 'ohmprint-labsettings-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// The smallest valid PNG (1×1 pixel) and a tiny JPEG header with a 2×3 frame (SOF0).
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');

/** A real PNG drawn by ImageMagick-free means: pdftoppm renders a one-page PDF we make with pdfkit. */
async function logoPng(): Promise<Buffer> {
  const PDFDocument = (await import('pdfkit')).default;
  const doc = new PDFDocument({ size: [240, 80], margin: 0 });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((r) => doc.on('end', () => r(Buffer.concat(chunks))));
  doc.on('data', (c: Buffer) => chunks.push(c));
  doc.rect(0, 0, 240, 80).fill('#00695c');
  doc.circle(40, 40, 26).fill('#ffffff');
  doc.fillColor('#ffffff').fontSize(30).text('CALDER', 80, 24);
  doc.end();
  const pdf = join(dir, 'logo.pdf');
  writeFileSync(pdf, await done);
  execFileSync('pdftoppm', ['-png', '-r', '72', '-singlefile', pdf, join(dir, 'logo')]);
  return (await import('node:fs')).readFileSync(join(dir, 'logo.png'));
}

interface P12Options {
  passphrase?: string;
  notBefore?: Date;
  notAfter?: Date;
  withKey?: boolean;
  count?: number;
  commonName?: string;
}

/** A PKCS#12 made here with node-forge (RSA key from Node, which is far faster than forge's). */
function makeP12({ passphrase = 'test passphrase', notBefore, notAfter, withKey = true, count = 2048, commonName = 'Calder Analytical signing (test)' }: P12Options = {}): Buffer {
  const { privateKey, publicKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
  const key = forge.pki.privateKeyFromPem(privateKey.export({ type: 'pkcs1', format: 'pem' }).toString());
  const cert = forge.pki.createCertificate();
  cert.publicKey = forge.pki.publicKeyFromPem(publicKey.export({ type: 'spki', format: 'pem' }).toString());
  cert.serialNumber = `01${randomBytes(8).toString('hex')}`;
  cert.validity.notBefore = notBefore ?? new Date(Date.now() - 86_400_000);
  cert.validity.notAfter = notAfter ?? new Date(Date.now() + 365 * 86_400_000);
  const name = [{ name: 'commonName', value: commonName }, { name: 'organizationName', value: 'Calder Analytical' }];
  cert.setSubject(name);
  cert.setIssuer(name);
  cert.sign(key, forge.md.sha256.create());
  const asn1 = forge.pkcs12.toPkcs12Asn1(withKey ? key : null, [cert], passphrase, { algorithm: '3des', count });
  return Buffer.from(forge.asn1.toDer(asn1).getBytes(), 'binary');
}

/**
 * Same file with its iteration counts rewritten to 1,000,000 through node-forge's ASN.1, deriving
 * nothing: `which` picks the MAC's (in the PFX's MacData) or the encryptions' (every other INTEGER
 * equal to the packing count, inside the authenticated safe's nested DER).
 */
function withMillionIterations(p12: Buffer, packedWith: number, which: 'mac' | 'encryption'): Buffer {
  const { asn1 } = forge;
  const million = asn1.integerToDer(1_000_000).getBytes();
  const packed = asn1.integerToDer(packedWith).getBytes();
  let rewritten = 0;
  const rewrite = (node: forge.asn1.Asn1): void => {
    if (Array.isArray(node.value)) node.value.forEach(rewrite);
    else if (node.type === asn1.Type.INTEGER && node.value === packed) {
      node.value = million;
      rewritten++;
    } else if (node.type === asn1.Type.OCTETSTRING && !node.constructed && node.value.length > 2) {
      try {
        const inner = asn1.fromDer(node.value);
        rewrite(inner);
        node.value = asn1.toDer(inner).getBytes();
      } catch {
        // not DER inside: salt, digest or ciphertext
      }
    }
  };
  const pfx = asn1.fromDer(p12.toString('binary'));
  const [, authSafe, macData] = pfx.value as forge.asn1.Asn1[];
  if (which === 'mac') rewrite(macData);
  else rewrite(authSafe);
  expect(rewritten).toBeGreaterThanOrEqual(1);
  return Buffer.from(asn1.toDer(pfx).getBytes(), 'binary');
}

const upload = async (file: Buffer, passphrase: string, name = 'signing.p12') =>
  request(t.app).post('/api/lab/signing-credential').set(await t.authFor('lab-admin')).field('passphrase', passphrase).attach('file', file, name);
const credentialNow = async () => (await request(t.app).get('/api/lab/signing-credential').set(await t.authFor('lab-admin'))).body.credential;

describe('lab profile', () => {
  it('edits contact and shipping details, audited, and every staff member reads them', async () => {
    const admin = await t.authFor('lab-admin');
    const res = await request(t.app)
      .patch('/api/lab/profile')
      .set(admin)
      .send({ contactEmail: ' Samples@Calder.TEST ', contactPhone: '+44 1632 960000', shippingAddress: 'Goods In\n4 Millrace Yard', shippingInstructions: 'Ship cool, Monday to Wednesday.' });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ contactEmail: 'samples@calder.test', contactPhone: '+44 1632 960000', shippingAddress: 'Goods In\n4 Millrace Yard', logo: null });
    const seen = await request(t.app).get('/api/lab/profile').set(await t.authFor('analyst'));
    expect(seen.body.shippingInstructions).toBe('Ship cool, Monday to Wednesday.');
    const [audit] = await t.db.query(`SELECT details FROM audit_event WHERE action = 'lab.profile-changed' ORDER BY created_at DESC LIMIT 1`);
    expect(audit.details.contactEmail).toEqual({ before: 'lab@calder.test', after: 'samples@calder.test' });
    // the columns the label pack reads
    const [row] = await t.db.query(`SELECT shipping_address, shipping_instructions FROM lab WHERE name = 'Calder Analytical'`);
    expect(row).toEqual({ shipping_address: 'Goods In\n4 Millrace Yard', shipping_instructions: 'Ship cool, Monday to Wednesday.' });
  });

  it('refuses a bad e-mail, phone, NUL byte and overlong text, naming each field, and changes nothing', async () => {
    const admin = await t.authFor('lab-admin');
    const before = (await request(t.app).get('/api/lab/profile').set(admin)).body;
    // A NUL byte is refused before anything else is read, naming its field.
    const nul = await request(t.app).patch('/api/lab/profile').set(admin).send({ shippingAddress: 'Dock\u0000 2', contactPhone: '+44 1632 960000' });
    expect(nul.status).toBe(400);
    expect(nul.body.errors.map((e: { field: string }) => e.field)).toEqual(['shippingAddress']);
    const res = await request(t.app)
      .patch('/api/lab/profile')
      .set(admin)
      .send({ contactEmail: 'not an address', contactPhone: 'call me maybe', shippingInstructions: 'x'.repeat(2001) });
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['contactEmail', 'contactPhone', 'shippingInstructions']);
    expect((await request(t.app).get('/api/lab/profile').set(admin)).body).toEqual(before);
  });

  it('is the lab admin’s to change; other roles, clients and strangers are refused', async () => {
    expect((await request(t.app).patch('/api/lab/profile').set(await t.authFor('reviewer')).send({ contactPhone: '1' })).status).toBe(403);
    expect((await request(t.app).get('/api/lab/profile').set(await t.authFor('client-admin'))).status).toBe(403);
    expect((await request(t.app).get('/api/lab/profile')).status).toBe(401);
    expect((await request(t.app).put('/api/lab/profile/logo').set(await t.authFor('analyst')).attach('logo', PNG, 'logo.png')).status).toBe(403);
    expect((await request(t.app).delete('/api/lab/profile/logo').set(await t.authFor('intake-technician'))).status).toBe(403);
    expect((await request(t.app).get('/api/lab/profile/logo').set(await t.authFor('client-admin'))).status).toBe(403);
  });
});

describe('lab logo', () => {
  it('refuses a text file named .png and a file over the limit, naming the field and the limit; keeps nothing', async () => {
    const admin = await t.authFor('lab-admin');
    const text = await request(t.app).put('/api/lab/profile/logo').set(admin).attach('logo', Buffer.from('just some text, not an image'), 'logo.png');
    expect(text.status).toBe(400);
    expect(text.body.detail).toContain('logo.png');
    expect(text.body.errors).toEqual([{ field: 'logo', message: 'is not a PNG or JPEG image (checked by its content, not its name).' }]);

    const big = Buffer.concat([PNG, Buffer.alloc(LAB_LOGO_MAX_BYTES)]);
    const tooLarge = await request(t.app).put('/api/lab/profile/logo').set(admin).attach('logo', big, 'huge.png');
    expect(tooLarge.status).toBe(413);
    expect(tooLarge.body.errors).toEqual([{ field: 'logo', message: `must be at most ${LAB_LOGO_MAX_BYTES} bytes` }]);
    expect(tooLarge.body.detail).toContain('512 KB');

    const webp = Buffer.concat([Buffer.from('RIFF'), Buffer.alloc(4), Buffer.from('WEBPVP8 '), Buffer.alloc(20)]);
    expect((await request(t.app).put('/api/lab/profile/logo').set(admin).attach('logo', webp, 'logo.webp')).status).toBe(400);
    const truncated = PNG.subarray(0, 12);
    const damaged = await request(t.app).put('/api/lab/profile/logo').set(admin).attach('logo', truncated, 'cut.png');
    expect(damaged.status).toBe(400);
    expect(damaged.body.errors[0].message).toContain('damaged PNG');
    expect((await request(t.app).put('/api/lab/profile/logo').set(admin)).status).toBe(400);

    expect((await request(t.app).get('/api/lab/profile').set(admin)).body.logo).toBeNull();
    expect((await request(t.app).get('/api/lab/profile/logo').set(admin)).status).toBe(404);
  });

  it('stores a PNG logo in PostgreSQL, serves it back, and prints it in the report header', async () => {
    const admin = await t.authFor('lab-admin');
    const png = await logoPng();
    const res = await request(t.app).put('/api/lab/profile/logo').set(admin).attach('logo', png, 'calder-logo.png');
    expect(res.status).toBe(200);
    expect(res.body.logo).toMatchObject({ contentType: 'image/png', sizeBytes: png.length, widthPx: 240, heightPx: 80 });
    const served = await request(t.app).get('/api/lab/profile/logo').set(await t.authFor('reviewer')).buffer(true);
    expect(served.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(served.body as Buffer, png)).toBe(0);
    // another lab has no logo and cannot see this one
    expect((await request(t.app).get('/api/lab/profile/logo').set(await t.authFor('lab-admin', 'marlow'))).status).toBe(404);

    const a = await insertSubmittedAnalysis(t.db.manager, { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' });
    const report = await t.db.transaction((manager) =>
      issueReport(manager, { labId: a.labId, analysisId: a.analysisId, sampleId: a.sampleId, clientOrganisationId: a.clientOrganisationId, actorUserId: a.reviewerUserId, content: demoReportContent() }),
    );
    const [{ pdf }] = await t.db.query('SELECT pdf FROM test_report WHERE id = $1', [report.id]);
    const file = join(dir, 'with-logo.pdf');
    writeFileSync(file, pdf);
    // One embedded image per page header (pdfimages lists each drawing of it).
    const images = execFileSync('pdfimages', ['-list', file], { encoding: 'utf8' }).trim().split('\n').slice(2);
    const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))![1]);
    expect(images.filter((l) => /\s240\s+80\s/.test(l))).toHaveLength(pages);
    expect(execFileSync('pdfsig', [file], { encoding: 'utf8' })).toContain('Signature is Valid.');

    const removed = await request(t.app).delete('/api/lab/profile/logo').set(admin);
    expect(removed.body.logo).toBeNull();
  });

  it('accepts a JPEG by its frame header', async () => {
    // SOI, APP0 (JFIF, 16 bytes), SOF0 (height 3, width 2), EOI: enough for the header check.
    const jpeg = Buffer.from('ffd8ffe000104a46494600010100000100010000ffc0000b080003000201011100ffd9', 'hex');
    const res = await request(t.app).put('/api/lab/profile/logo').set(await t.authFor('lab-admin')).attach('logo', jpeg, 'logo.bin');
    expect(res.status).toBe(200);
    expect(res.body.logo).toMatchObject({ contentType: 'image/jpeg', widthPx: 2, heightPx: 3 });
    await request(t.app).delete('/api/lab/profile/logo').set(await t.authFor('lab-admin'));
  });
});

describe('signing certificate upload', () => {
  it('refuses each unusable file with its own message, and the credential in use still signs', async () => {
    const good = makeP12({ passphrase: 'right one', commonName: 'Calder first (test)' });
    const first = await upload(good, 'right one');
    expect(first.status).toBe(201);
    const inUse = await credentialNow();
    expect(inUse).toMatchObject({ origin: 'uploaded', subject: expect.stringContaining('CN=Calder first (test)') });

    const cases: Array<[string, Buffer, string, RegExp, string]> = [
      ['wrong passphrase', makeP12({ passphrase: 'right one' }), 'wrong one', /passphrase is wrong/, 'passphrase'],
      ['expired', makeP12({ notBefore: new Date('2020-01-01'), notAfter: new Date('2021-01-01') }), 'test passphrase', /expired on 2021-01-01/, 'file'],
      ['not yet valid', makeP12({ notBefore: new Date(Date.now() + 30 * 86_400_000) }), 'test passphrase', /not valid before/, 'file'],
      ['no private key', makeP12({ withKey: false }), 'test passphrase', /no private key/, 'file'],
      ['garbage', randomBytes(2000), 'x', /not a PKCS#12/, 'file'],
      ['a text file named .p12', Buffer.from('-----BEGIN CERTIFICATE-----\nnot really\n'), 'x', /not a PKCS#12/, 'file'],
    ];
    for (const [what, file, passphrase, message, field] of cases) {
      const res = await upload(file, passphrase);
      expect({ what, status: res.status }).toEqual({ what, status: 400 });
      expect(res.body.detail).toMatch(message);
      expect(res.body.errors[0].field).toBe(field);
      expect(res.headers['content-type']).toContain('application/problem+json');
    }
    expect(await credentialNow()).toEqual(inUse);

    const a = await insertSubmittedAnalysis(t.db.manager, { labName: 'Calder Analytical', clientName: 'Sunvale Juice Works', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' });
    const report = await t.db.transaction((manager) =>
      issueReport(manager, { labId: a.labId, analysisId: a.analysisId, sampleId: a.sampleId, clientOrganisationId: a.clientOrganisationId, actorUserId: a.reviewerUserId, content: demoReportContent() }),
    );
    const [{ pdf }] = await t.db.query('SELECT pdf FROM test_report WHERE id = $1', [report.id]);
    writeFileSync(join(dir, 'still.pdf'), pdf);
    const sig = execFileSync('pdfsig', [join(dir, 'still.pdf')], { encoding: 'utf8' });
    expect(sig).toContain('Signer Certificate Common Name: Calder first (test)');
    expect(sig).toContain('Signature is Valid.');
  });

  it('refuses a million key-derivation iterations, naming the limit, before deriving any key', async () => {
    const base = makeP12({ count: 4096 });
    const generateKey = jest.spyOn(forge.pkcs12, 'generateKey');
    const getCipher = jest.spyOn((forge.pki as unknown as { pbe: { getCipher: () => unknown } }).pbe, 'getCipher');
    try {
      for (const which of ['mac', 'encryption'] as const) {
        const res = await upload(withMillionIterations(base, 4096, which), 'test passphrase');
        expect(res.status).toBe(400);
        expect(res.body.detail).toContain('1,000,000 key-derivation iterations');
        expect(res.body.detail).toContain(`at most ${MAX_PKCS12_ITERATIONS.toLocaleString('en-GB')}`);
        expect(res.body.detail).toContain(which === 'mac' ? 'MAC' : 'encryption');
        expect(res.body.errors[0].field).toBe('file');
      }
      expect(generateKey).not.toHaveBeenCalled();
      expect(getCipher).not.toHaveBeenCalled();
    } finally {
      generateKey.mockRestore();
      getCipher.mockRestore();
    }
    // The same file with its own counts (4096, under the limit) opens.
    expect((await upload(base, 'test passphrase')).status).toBe(201);
  });
});

describe('next report number', () => {
  it('tells the reviewer the number to come and the signing credential, without taking the number', async () => {
    const reviewer = await t.authFor('reviewer');
    const first = await request(t.app).get('/api/lab/report-numbers/next').set(reviewer);
    expect(first.status).toBe(200);
    const again = await request(t.app).get('/api/lab/report-numbers/next').set(reviewer);
    expect(again.body.nextReportNumber).toBe(first.body.nextReportNumber);
    expect(first.body.credential).toMatchObject({ origin: 'uploaded' });
    expect(first.body.withoutCredential).toBeNull();

    const a = await insertSubmittedAnalysis(t.db.manager, { labName: 'Calder Analytical', clientName: 'Hollin Ridge Cellars', analystEmail: 'analyst@calder.test', reviewerEmail: 'reviewer@calder.test' });
    const report = await t.db.transaction((manager) =>
      issueReport(manager, { labId: a.labId, analysisId: a.analysisId, sampleId: a.sampleId, clientOrganisationId: a.clientOrganisationId, actorUserId: a.reviewerUserId, content: demoReportContent() }),
    );
    expect(report.number).toBe(first.body.nextReportNumber);
    const after = await request(t.app).get('/api/lab/report-numbers/next').set(reviewer);
    expect(after.body.nextReportNumber).not.toBe(report.number);
    expect(Number(after.body.nextReportNumber.slice(-6))).toBe(Number(report.number.slice(-6)) + 1);
  });

  it('says a lab with no credential will get the development self-signed one; staff without review rights and other tenants are refused', async () => {
    const marlow = await request(t.app).get('/api/lab/report-numbers/next').set(await t.authFor('reviewer', 'marlow'));
    expect(marlow.status).toBe(200);
    expect(marlow.body).toMatchObject({ credential: null, withoutCredential: 'development-self-signed' });
    expect(marlow.body.nextReportNumber).toMatch(/^MAR-\d{4}-000001$/);
    expect((await request(t.app).get('/api/lab/report-numbers/next').set(await t.authFor('analyst'))).status).toBe(403);
    expect((await request(t.app).get('/api/lab/report-numbers/next').set(await t.authFor('client-admin'))).status).toBe(403);
    expect((await request(t.app).get('/api/lab/report-numbers/next')).status).toBe(401);
  });
});
