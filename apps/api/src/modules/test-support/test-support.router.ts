import { Router } from 'express';
import { z } from 'zod';
import { shopRoleSchema } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { bodyOf, validate } from '../../middleware/validate';
import { createShopWithUsers } from './test-support.service';

export const createTestShopRequestSchema = z
  .object({
    roles: z.array(shopRoleSchema).max(20).default(['owner', 'mechanic', 'buyer', 'viewer']),
    namePrefix: z.string().trim().min(1).max(60).optional(),
    platformAdmin: z.boolean().default(false),
    spendingLimitMinor: z.number().int().min(0).nullable().optional(),
    /** Existing shops every created (non-admin) user also joins, e.g. to test shop switching. */
    alsoMemberOf: z.array(z.object({ shopId: z.uuid(), role: shopRoleSchema }).strict()).max(10).default([]),
  })
  .strict();

export const createTestShopResponseSchema = z.object({
  shop: z.object({ id: z.uuid(), name: z.string(), slug: z.string() }),
  password: z.string(),
  users: z.array(z.object({ id: z.uuid(), email: z.string(), name: z.string(), role: z.union([shopRoleSchema, z.literal('platform_admin')]) })),
});

/**
 * /api/test-support: only mounted when TAPPET_MODE=test (app.ts), never in demo or production.
 * Browser tests create their own shop and users here so they can run in parallel.
 */
export function testSupportRouter(deps: { db: Database; clock: Clock }): Router {
  const router = Router();
  router.post('/shops', validate({ body: createTestShopRequestSchema }), async (req, res) => {
    res.status(201).json(await createShopWithUsers(deps.db, deps.clock, bodyOf(createTestShopRequestSchema, req)));
  });
  return router;
}
