import type { EntityManager } from 'typeorm';

/**
 * Brings an order's status in line with its samples: placed until one arrives, closed when every
 * sample was rejected at intake (nothing reported, every credit returned), completed once every
 * sample is reported or rejected, in progress between. A cancelled order stays cancelled.
 */
export async function refreshOrderStatus(manager: EntityManager, labId: string, orderId: string): Promise<void> {
  await manager.query(
    `UPDATE test_order o SET status = x.status, updated_at = now()
     FROM (
       SELECT CASE
         WHEN bool_and(s.state = 'awaiting-arrival') THEN 'placed'
         WHEN bool_and(s.state = 'rejected') THEN 'closed'
         WHEN bool_and(s.state IN ('reported', 'rejected')) THEN 'completed'
         ELSE 'in-progress' END AS status
       FROM sample s WHERE s.order_id = $2 AND s.lab_id = $1
     ) x
     WHERE o.id = $2 AND o.lab_id = $1 AND o.status <> 'cancelled' AND o.status <> x.status`,
    [labId, orderId],
  );
}
