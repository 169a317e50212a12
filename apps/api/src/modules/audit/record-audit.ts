import type { EntityManager, QueryDeepPartialEntity } from 'typeorm';
import { AuditEvent } from './audit-event.entity';

export interface AuditEntry {
  labId: string | null;
  actorUserId: string | null;
  /** Dotted verb, e.g. `auth.sign-in`, `staff.roles-changed`, `sample.accepted`. */
  action: string;
  subjectType: string;
  subjectId: string | null;
  details?: Record<string, unknown>;
}

/** Writes an audit event with the caller's transaction, so it exists exactly when the change does. */
export async function recordAudit(manager: EntityManager, entry: AuditEntry): Promise<void> {
  // jsonb takes the object as it is; TypeORM's insert type only objects to its open shape.
  const details = (entry.details ?? {}) as QueryDeepPartialEntity<Record<string, unknown>>;
  await manager.insert(AuditEvent, { ...entry, details });
}
