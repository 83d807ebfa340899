import { AbilityProvider, useAbility } from '@casl/react';
import { defineAbilityFor, subjectOf, type Action, type AppAbility, type SubjectName, type SubjectRecord } from '@tappet/permissions';
import { useMemo, type ReactNode } from 'react';
import type { Me } from './auth';

/**
 * The same ability the API enforces, built from /api/me for one shop (or for no shop). The web
 * app only uses it to hide what the person cannot do; the API still says no on its own.
 */
export function abilityFor(me: Me, shopId: string | null): AppAbility {
  const membership = shopId ? me.memberships.find((m) => m.shopId === shopId) : undefined;
  return defineAbilityFor(
    { userId: me.user.id, isPlatformAdmin: me.user.isPlatformAdmin },
    membership
      ? {
          shopId: membership.shopId,
          role: membership.role,
          spendingLimitMinor: membership.spendingLimitMinor,
          // A suspended or cancelled shop: write controls are hidden, as the API would refuse them.
          writable: !membership.readOnly,
          viaSupportGrant: membership.supportUntil != null,
        }
      : null,
  );
}

/** Provides the ability for the person in the given shop to everything below. */
export function ShopAbilityProvider({ me, shopId, children }: { me: Me; shopId: string | null; children: ReactNode }) {
  const ability = useMemo(() => abilityFor(me, shopId), [me, shopId]);
  return <AbilityProvider value={ability}>{children}</AbilityProvider>;
}

/** The ability provided above. */
export function useAppAbility(): AppAbility {
  return useAbility<AppAbility>();
}

/** Checks a concrete record (not just the type), so the shop condition of each rule applies. */
export function canOn(ability: AppAbility, action: Action, subject: SubjectName, record: SubjectRecord): boolean {
  return ability.can(action, subjectOf(subject, record));
}

/**
 * Whether the person may do `action` on a record of `subject` in `shopId`. Checking a concrete
 * record (not just the type) lets the shop condition of each rule apply.
 */
export function useCan(action: Action, subject: SubjectName, record: SubjectRecord): boolean {
  return canOn(useAppAbility(), action, subject, record);
}

/** Renders its children only when the person may do `action` on the record. */
export function Can({ I, a, this: record, children, fallback = null }: { I: Action; a: SubjectName; this: SubjectRecord; children: ReactNode; fallback?: ReactNode }) {
  return useCan(I, a, record) ? <>{children}</> : <>{fallback}</>;
}
