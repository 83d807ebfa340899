import { meWithActiveShopSchema } from '@tappet/contracts';

/** /api/me's answer; its own module so lib/auth can load it (and zod) on demand. */
export const meSchema = meWithActiveShopSchema;
