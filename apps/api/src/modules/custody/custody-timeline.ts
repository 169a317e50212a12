import type { EntityManager } from 'typeorm';
import type { CustodyTimeline, RecordCustodyEvent } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { findLabSample } from '../samples/sample-access';
import { appendCustody } from './append-custody';

/** The sample's chain of custody, oldest first. */
export async function custodyTimeline(manager: EntityManager, labId: string, sampleId: string): Promise<CustodyTimeline> {
  await findLabSample(manager, labId, sampleId);
  const rows: { id: string; kind: CustodyTimeline['events'][number]['kind']; location: string; reason: string; occurred_at: Date; recorded_at: Date; actor_id: string; actor_name: string }[] =
    await manager.query(
      `SELECT e.id, e.kind, e.location, e.reason, e.occurred_at, e.recorded_at, u.id AS actor_id, u.display_name AS actor_name
       FROM custody_event e JOIN app_user u ON u.id = e.actor_user_id
       WHERE e.lab_id = $1 AND e.sample_id = $2
       ORDER BY e.occurred_at, e.entry_no`,
      [labId, sampleId],
    );
  return {
    sampleId,
    events: rows.map((r) => ({
      id: r.id,
      kind: r.kind,
      location: r.location,
      reason: r.reason,
      actor: { id: r.actor_id, displayName: r.actor_name },
      occurredAt: r.occurred_at.toISOString(),
      recordedAt: r.recorded_at.toISOString(),
    })),
  };
}

/** A movement by hand. Only samples the lab has received can move; a future time is refused. */
export async function recordMovement(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, body: RecordCustodyEvent): Promise<void> {
  const sample = await findLabSample(manager, labId, sampleId, true);
  if (sample.state === 'awaiting-arrival') throw ApiError.conflict(`Sample ${sample.code} has not arrived yet; record its arrival first.`);
  const occurredAt = body.occurredAt ? new Date(body.occurredAt) : new Date();
  if (occurredAt.getTime() > Date.now() + 5 * 60_000) {
    throw ApiError.badRequest('The time of the event is in the future; enter when it actually happened.', [{ field: 'occurredAt', message: 'must not be in the future' }]);
  }
  await appendCustody(manager, { labId, sampleId, kind: body.kind, location: body.location, reason: body.reason, actorUserId: auth.userId, occurredAt });
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: `custody.${body.kind}`, subjectType: 'sample', subjectId: sampleId, details: { code: sample.code, location: body.location } });
}
