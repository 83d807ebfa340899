import type { AppAbility } from '@tappet/permissions';
import type { AuthContext } from '../modules/auth/auth.service';
import type { ApiKeyContext } from '../modules/api-keys/api-keys.service';
import type { Membership, Shop } from '../modules/shops/shops.entity';

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by `authenticate` for a valid session. */
    auth?: AuthContext;
    /** Set by `authenticate` for `Authorization: Bearer tpk_…` (then `auth` is not set). */
    apiKey?: ApiKeyContext;
    /** Set by `tenantContext` on /api/shops/:shopId routes. */
    shop?: Shop;
    membership?: Membership;
    ability?: AppAbility;
  }
}
