import type { AppAbility } from '@tappet/permissions';
import type { AuthContext } from '../modules/auth/auth.service';
import type { Membership, Shop } from '../modules/shops/shops.entity';

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by `authenticate` for a valid session. */
    auth?: AuthContext;
    /** Set by `tenantContext` on /api/shops/:shopId routes. */
    shop?: Shop;
    membership?: Membership;
    ability?: AppAbility;
  }
}
