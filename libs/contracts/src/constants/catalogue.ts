// Schema-free: screens import these values without pulling zod into their chunk (docs/decisions/024-mobile-first-load.md).

export const partOrigins = ['genuine', 'reproduction', 'pattern'] as const;
export type PartOrigin = (typeof partOrigins)[number];

/** `nla`: no longer available from anyone. */
export const partStatuses = ['available', 'nla'] as const;
export type PartStatusValue = (typeof partStatuses)[number];

export const linkKinds = ['replaced_by', 'kit_contains', 'equivalent'] as const;

/** For `equivalent` only `both` and `one_way` apply; `one_way` means the `to` part stands in for the `from` part. */
export const interchanges = ['both', 'one_way', 'with_changes'] as const;
