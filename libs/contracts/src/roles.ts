import { z } from 'zod';

import { shopRoles } from './constants/roles';

export * from './constants/roles';
export const shopRoleSchema = z.enum(shopRoles);
