import { z } from 'zod';

/** The roles a person can hold in one shop. Platform admin is a flag on the user, not a shop role. */
export const shopRoles = ['owner', 'mechanic', 'buyer', 'viewer'] as const;
export const shopRoleSchema = z.enum(shopRoles);
export type ShopRole = z.infer<typeof shopRoleSchema>;

export const roleLabels: Record<ShopRole, string> = {
  owner: 'Owner',
  mechanic: 'Mechanic',
  buyer: 'Parts buyer',
  viewer: 'Viewer',
};
