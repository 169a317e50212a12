import { createHash, randomBytes } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { INSTRUMENT_KEY_PREFIX, type InstrumentKey as InstrumentKeyView, type IssuedInstrumentKey } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { InstrumentKey } from './instrument-key.entity';

const BASE32 = 'abcdefghijklmnopqrstuvwxyz234567';
/** Characters after the prefix kept visible so a lab can tell its keys apart. */
const VISIBLE = 6;

/** 200 random bits as 40 base-32 characters: unguessable, and safe in headers and config files. */
function secretBody(): string {
  const bytes = randomBytes(25);
  let bits = 0;
  let value = 0;
  let out = '';
  for (const byte of bytes) {
    value = (value << 8) | byte;
    bits += 8;
    while (bits >= 5) {
      out += BASE32[(value >>> (bits - 5)) & 31];
      bits -= 5;
    }
  }
  return out;
}

export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

interface KeyRow {
  id: string;
  name: string;
  prefix: string;
  created_at: Date;
  last_used_at: Date | null;
  revoked_at: Date | null;
  by_id: string;
  by_name: string;
}

const view = (r: KeyRow): InstrumentKeyView => ({
  id: r.id,
  name: r.name,
  prefix: r.prefix,
  createdBy: { id: r.by_id, displayName: r.by_name },
  createdAt: r.created_at.toISOString(),
  lastUsedAt: r.last_used_at?.toISOString() ?? null,
  revokedAt: r.revoked_at?.toISOString() ?? null,
});

export async function listInstrumentKeys(manager: EntityManager, labId: string, keyId?: string): Promise<InstrumentKeyView[]> {
  const rows: KeyRow[] = await manager.query(
    `SELECT k.id, k.name, k.prefix, k.created_at, k.last_used_at, k.revoked_at, u.id AS by_id, u.display_name AS by_name
     FROM instrument_key k JOIN app_user u ON u.id = k.created_by_user_id
     WHERE k.lab_id = $1 ${keyId ? 'AND k.id = $2' : ''}
     ORDER BY k.revoked_at IS NOT NULL, k.created_at DESC`,
    keyId ? [labId, keyId] : [labId],
  );
  return rows.map(view);
}

/** Issues a key; the full secret is in this answer only, the database keeps its SHA-256. */
export async function issueInstrumentKey(manager: EntityManager, auth: AuthContext, labId: string, name: string): Promise<IssuedInstrumentKey> {
  const secret = `${INSTRUMENT_KEY_PREFIX}${secretBody()}`;
  const prefix = secret.slice(0, INSTRUMENT_KEY_PREFIX.length + VISIBLE);
  const inserted = await manager.insert(InstrumentKey, { labId, name, prefix, secretSha256: sha256Hex(secret), createdByUserId: auth.userId, createdAt: new Date() });
  const id = inserted.identifiers[0].id as string;
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'instrument-key.issued', subjectType: 'instrument_key', subjectId: id, details: { name, prefix } });
  const [key] = await listInstrumentKeys(manager, labId, id);
  return { key, secret };
}

export async function revokeInstrumentKey(manager: EntityManager, auth: AuthContext, labId: string, keyId: string): Promise<InstrumentKeyView> {
  const key = await manager.findOne(InstrumentKey, { where: { id: keyId, labId } });
  if (!key) throw ApiError.notFound('Instrument key');
  if (key.revokedAt) throw ApiError.conflict(`Instrument key ${key.prefix}… was already revoked.`);
  await manager.update(InstrumentKey, { id: keyId, labId }, { revokedAt: new Date(), revokedByUserId: auth.userId });
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'instrument-key.revoked', subjectType: 'instrument_key', subjectId: keyId, details: { name: key.name, prefix: key.prefix } });
  const [updated] = await listInstrumentKeys(manager, labId, keyId);
  return updated;
}

/** The live key a bench computer presented, with its lab; its last-used time is brought up to date. */
export async function authenticateInstrumentKey(manager: EntityManager, secret: string): Promise<{ keyId: string; labId: string }> {
  const rows: { id: string; lab_id: string }[] = await manager.query(
    `WITH used AS (UPDATE instrument_key SET last_used_at = now() WHERE secret_sha256 = $1 AND revoked_at IS NULL RETURNING id, lab_id)
     SELECT id, lab_id FROM used`,
    [sha256Hex(secret)],
  );
  if (!rows.length) throw ApiError.unauthorized('This instrument key is unknown or has been revoked; ask a lab admin for a new one.');
  return { keyId: rows[0].id, labId: rows[0].lab_id };
}
