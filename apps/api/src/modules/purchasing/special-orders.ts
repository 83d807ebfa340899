import { In, type EntityManager } from 'typeorm';
import { JobEntity, JobSpecialOrderEntity } from '../jobs/jobs.entity';
import { openSpecialOrders } from '../jobs/jobs.service';

/** Order states in which a line still stands to deliver (a special order on one is being bought). */
export const LIVE_ORDER_STATES = ['draft', 'awaiting_approval', 'approved', 'sent', 'partly_received'] as const;

/** A job's special order purchasing still has to buy: `remaining` = asked for − already received for it. */
export interface WaitingSpecialOrder {
  id: string;
  jobId: string;
  jobNumber: number;
  partId: string;
  quantity: number;
  remaining: number;
  createdAt: Date;
}

/**
 * The special orders waiting to be bought: open ones (the jobs module's `openSpecialOrders`), and
 * ordered ones whose order was cancelled or closed short (no line on a live order, and less
 * received than the job asked for), so a part a job needs is never silently dropped. Each comes
 * with what is still to buy.
 */
export async function waitingSpecialOrders(reader: EntityManager, shopId: string): Promise<WaitingSpecialOrder[]> {
  const open = await openSpecialOrders(reader, shopId);
  const ordered = await reader.find(JobSpecialOrderEntity, { where: { shopId, status: 'ordered' }, order: { createdAt: 'ASC', id: 'ASC' } });
  const jobs = new Map(
    ordered.length ? (await reader.find(JobEntity, { where: { shopId, id: In([...new Set(ordered.map((o) => o.jobId))]) } })).map((j) => [j.id, j.number]) : [],
  );
  const lines = await reader.query<Array<{ id: string; status: string; received: number }>>(
    `SELECT l.special_order_id AS id, o.status, l.received_quantity AS received FROM purchase_order_lines l
     JOIN purchase_orders o ON o.shop_id = l.shop_id AND o.id = l.order_id WHERE l.shop_id = ? AND l.special_order_id IS NOT NULL`,
    [shopId],
  );
  const live = new Set(lines.filter((l) => (LIVE_ORDER_STATES as readonly string[]).includes(l.status)).map((l) => l.id));
  const received = new Map<string, number>();
  for (const l of lines) received.set(l.id, (received.get(l.id) ?? 0) + Number(l.received));
  const all = [
    ...open.map((o) => ({ id: o.id, jobId: o.jobId, jobNumber: Number(o.jobNumber), partId: o.partId, quantity: o.quantity, createdAt: o.createdAt })),
    ...ordered.map((o) => ({ id: o.id, jobId: o.jobId, jobNumber: jobs.get(o.jobId) ?? 0, partId: o.partId, quantity: o.quantity, createdAt: new Date(o.createdAt) })),
  ];
  return all
    .filter((o) => !live.has(o.id))
    .map((o) => ({ ...o, remaining: o.quantity - Math.min(o.quantity, received.get(o.id) ?? 0) }))
    .filter((o) => o.remaining > 0)
    .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime() || a.id.localeCompare(b.id));
}

/** What has already been received for a special order, over every line linked to it. */
export async function receivedForSpecialOrder(manager: EntityManager, shopId: string, specialOrderId: string): Promise<number> {
  const [row] = await manager.query<Array<{ n: number | null }>>(`SELECT SUM(received_quantity) AS n FROM purchase_order_lines WHERE shop_id = ? AND special_order_id = ?`, [shopId, specialOrderId]);
  return Number(row?.n ?? 0);
}
