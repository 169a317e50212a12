import type { EntityManager } from 'typeorm';
import type { CustodyEventKind } from '@ohmprint/contracts';
import { CustodyEvent } from './custody-event.entity';

export interface CustodyEntry {
  labId: string;
  sampleId: string;
  kind: CustodyEventKind;
  location: string;
  reason: string;
  actorUserId: string;
  occurredAt?: Date;
}

/** Appends a link to the chain of custody inside the caller's transaction. */
export async function appendCustody(manager: EntityManager, entry: CustodyEntry): Promise<string> {
  const now = new Date();
  const result = await manager.insert(CustodyEvent, { ...entry, occurredAt: entry.occurredAt ?? now, recordedAt: now });
  return result.identifiers[0].id as string;
}
