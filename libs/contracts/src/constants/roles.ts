// Schema-free: screens import these words without pulling zod into their chunk (docs/decisions/024-mobile-first-load.md).

/** The roles a person can hold in one shop. Platform admin is a flag on the user, not a shop role. */
export const shopRoles = ['owner', 'mechanic', 'buyer', 'viewer'] as const;
export type ShopRole = (typeof shopRoles)[number];

export const roleLabels: Record<ShopRole, string> = {
  owner: 'Owner',
  mechanic: 'Mechanic',
  buyer: 'Parts buyer',
  viewer: 'Viewer',
};
