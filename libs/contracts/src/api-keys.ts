import { z } from 'zod';
import { idSchema, shopIdParamsSchema } from './common';

/** Roles an API key can carry: never more than a buyer. */
export const apiKeyRoleSchema = z.enum(['viewer', 'buyer']);
export type ApiKeyRole = z.infer<typeof apiKeyRoleSchema>;

/** The visible prefix of every key secret; `Authorization: Bearer tpk_…`. */
export const apiKeyPrefix = 'tpk_';

export const createApiKeyRequestSchema = z
  .object({
    label: z.string().trim().min(1, 'Give the key a label.').max(100, 'Use at most 100 characters.'),
    role: apiKeyRoleSchema,
    /** Bind the key to a named integration instead of the owner who creates it. */
    integrationName: z.string().trim().min(1).max(100, 'Use at most 100 characters.').optional(),
  })
  .strict();
export type CreateApiKeyRequest = z.infer<typeof createApiKeyRequestSchema>;

export const apiKeySummarySchema = z.object({
  id: idSchema,
  label: z.string(),
  role: apiKeyRoleSchema,
  /** The integration the key belongs to, or null when it acts for the owner who created it. */
  integrationName: z.string().nullable(),
  createdBy: z.object({ id: idSchema, name: z.string() }).nullable(),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
export type ApiKeySummary = z.infer<typeof apiKeySummarySchema>;

export const apiKeyListResponseSchema = z.object({ keys: z.array(apiKeySummarySchema) });
export type ApiKeyListResponse = z.infer<typeof apiKeyListResponseSchema>;

/** The answer to creating a key: the only time the secret is ever shown. */
export const createApiKeyResponseSchema = z.object({ key: apiKeySummarySchema, secret: z.string() });
export type CreateApiKeyResponse = z.infer<typeof createApiKeyResponseSchema>;

export const apiKeyParamsSchema = shopIdParamsSchema.extend({ apiKeyId: idSchema }).strict();
