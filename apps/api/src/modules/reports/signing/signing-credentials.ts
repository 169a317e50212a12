import { randomBytes, randomUUID } from 'node:crypto';
import { IsNull, type EntityManager } from 'typeorm';
import type { SigningCredentialSummary } from '@ohmprint/contracts';
import { ApiError } from '../../../core/api-error';
import { config } from '../../../config';
import { recordAudit } from '../../audit/record-audit';
import { SigningCredential, CredentialOrigin } from './signing-credential.entity';
import { runCpuTask } from '../../../core/cpu-pool/cpu-pool';
import { CredentialError, type CredentialDetails } from './credential-details';
import { credentialSealingKey } from './sealing-key';
import { seal, unseal } from './sealed-secret';

/** A credential opened for signing; lives only for the duration of one issuance. */
export interface OpenCredential {
  id: string;
  p12: Buffer;
  passphrase: string;
}

const aad = (labId: string, id: string, part: 'p12' | 'passphrase') => `signing_credential/${labId}/${id}/${part}`;

/**
 * `readCredential` in a worker thread: deriving a PKCS#12 file's keys is slow by design (up to
 * the iteration limit), and must never hold up the event loop. Throws `CredentialError` as the
 * in-process call would.
 */
export async function readCredentialOffThread(p12: Buffer, passphrase: string, now = new Date()): Promise<CredentialDetails> {
  const details = await runCpuTask('openCredential', { p12: new Uint8Array(p12), passphrase, now });
  if ('credentialError' in details) throw new CredentialError(details.credentialError);
  return details;
}

async function store(manager: EntityManager, labId: string, origin: CredentialOrigin, p12: Buffer, passphrase: string, uploadedBy: string | null, read?: CredentialDetails): Promise<SigningCredential | null> {
  const details = read ?? (await readCredentialOffThread(p12, passphrase));
  const key = credentialSealingKey();
  const id = randomUUID();
  // ON CONFLICT DO NOTHING: two first issuances racing in development create one credential, not an error.
  const inserted = await manager
    .createQueryBuilder()
    .insert()
    .into(SigningCredential)
    .values({
      id,
      labId,
      origin,
      sealedP12: seal(p12, key, aad(labId, id, 'p12')),
      sealedPassphrase: seal(Buffer.from(passphrase, 'utf8'), key, aad(labId, id, 'passphrase')),
      ...details,
      uploadedByUserId: uploadedBy,
      retiredAt: null,
    })
    .orIgnore()
    .returning('id')
    .execute();
  if (!inserted.raw.length) return null;
  return manager.findOneByOrFail(SigningCredential, { id });
}

function open(credential: SigningCredential): OpenCredential {
  const key = credentialSealingKey();
  try {
    return {
      id: credential.id,
      p12: unseal(credential.sealedP12, key, aad(credential.labId, credential.id, 'p12')),
      passphrase: unseal(credential.sealedPassphrase, key, aad(credential.labId, credential.id, 'passphrase')).toString('utf8'),
    };
  } catch {
    throw new Error(`Signing credential ${credential.id} cannot be unsealed: the sealing key (SIGNING_CREDENTIAL_KEY) differs from the one it was sealed with.`);
  }
}

export function currentCredential(manager: EntityManager, labId: string): Promise<SigningCredential | null> {
  return manager.findOneBy(SigningCredential, { labId, retiredAt: IsNull() });
}

/**
 * The credential a report is signed with. In development a lab without one gets a self-signed
 * credential on first need; in production the lab admin must have uploaded one.
 */
export async function credentialForSigning(manager: EntityManager, lab: { id: string; name: string }): Promise<OpenCredential> {
  let credential = await currentCredential(manager, lab.id);
  if (!credential) {
    if (config.production) {
      throw ApiError.conflict('This lab has no signing credential yet: a lab admin must upload its PKCS#12 file before reports can be issued.');
    }
    const passphrase = randomBytes(24).toString('base64url');
    // An RSA key pair takes a moment to generate: a worker thread does it.
    const generated = await runCpuTask('selfSignedCredential', { labName: lab.name, passphrase });
    const p12 = Buffer.from(generated.buffer, generated.byteOffset, generated.byteLength);
    credential = (await store(manager, lab.id, 'development', p12, passphrase, null)) ?? (await currentCredential(manager, lab.id));
    if (!credential) throw new Error(`No signing credential could be created for lab ${lab.id}.`);
  }
  if (credential.notAfter < new Date()) {
    throw ApiError.conflict(`The lab's signing certificate expired on ${credential.notAfter.toISOString().slice(0, 10)}: a lab admin must upload a new one.`);
  }
  return open(credential);
}

/**
 * Opens an uploaded PKCS#12 file in the worker pool (key derivation is slow by design) and checks
 * it is in date, before any database work: a wrong passphrase or a bad file is a 400 naming the
 * field, and no connection waits on the derivation.
 */
export async function openUploadedCredential(p12: Buffer, passphrase: string): Promise<CredentialDetails> {
  try {
    return await readCredentialOffThread(p12, passphrase);
  } catch (error) {
    if (error instanceof CredentialError) {
      const field = /passphrase/.test(error.message) ? 'passphrase' : 'file';
      throw ApiError.badRequest(error.message, [{ field, message: error.message }]);
    }
    throw error;
  }
}

/**
 * Replaces the lab's credential with an uploaded PKCS#12 file, opened and checked first
 * (`openUploadedCredential`, outside any transaction); the transaction only retires the old
 * credential and stores the new one.
 */
export async function uploadCredential(manager: EntityManager, input: { labId: string; actorUserId: string; p12: Buffer; passphrase: string; details: CredentialDetails }): Promise<SigningCredential> {
  const { details } = input;
  const previous = await currentCredential(manager, input.labId);
  if (previous) await manager.update(SigningCredential, { id: previous.id }, { retiredAt: new Date() });
  const stored = await store(manager, input.labId, 'uploaded', input.p12, input.passphrase, input.actorUserId, details);
  if (!stored) throw ApiError.conflict('Another signing credential was uploaded at the same moment; reload and try again.');
  await recordAudit(manager, {
    labId: input.labId,
    actorUserId: input.actorUserId,
    action: 'signing-credential.uploaded',
    subjectType: 'signing-credential',
    subjectId: stored.id,
    details: { subject: stored.subject, issuer: stored.issuer, fingerprintSha256: stored.fingerprintSha256, replaced: previous?.id ?? null },
  });
  return stored;
}

/** The public facts of a credential; never the key, the file or the passphrase. */
export function describeCredential(c: SigningCredential): SigningCredentialSummary {
  return {
    id: c.id,
    origin: c.origin,
    subject: c.subject,
    issuer: c.issuer,
    serialNumber: c.serialNumber,
    fingerprintSha256: c.fingerprintSha256,
    notBefore: c.notBefore.toISOString(),
    notAfter: c.notAfter.toISOString(),
    createdAt: c.createdAt.toISOString(),
  };
}
