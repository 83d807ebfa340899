import { roleLabels } from '@tappet/contracts';
import { MenuButton, useToast } from '@tappet/ui';
import { useRef } from 'react';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import type { Me } from '../../../lib/auth';
import { useSetActiveShop } from '../api/set-active-shop';

/**
 * The current shop's name and a "Switch shop" menu of the person's shops. Choosing one tells the
 * API, clears the previous shop's cache and opens the new shop's home.
 */
export function ShopSwitcher({ me, currentShopId }: { me: Me; currentShopId: string | null }) {
  const navigate = useNavigate();
  const toast = useToast();
  const setActive = useSetActiveShop();
  // One "now working in" note at a time: the newest replaces the last.
  const lastNote = useRef<number | null>(null);
  const current = me.memberships.find((m) => m.shopId === currentShopId);

  if (me.memberships.length === 0) return null;

  return (
    <div className="flex min-w-0 items-center gap-2">
      {current && (
        <p className="min-w-0 truncate font-bold" title={current.shopName}>
          <span className="sr-only">Current shop: </span>
          {current.shopName}
        </p>
      )}
      <MenuButton
        label="Switch shop"
        align="start"
        items={me.memberships.map((m) => ({
          key: m.shopId,
          label: m.shopName,
          detail: m.supportUntil ? 'Support access' : roleLabels[m.role],
          current: m.shopId === currentShopId,
          onSelect: () => {
            if (m.shopId === currentShopId) return;
            if (m.supportUntil) {
              // Support access is not a membership: the session's active shop stays the same.
              navigate(paths.shop.home.getHref(m.shopId));
              return;
            }
            setActive.mutate(m.shopId, {
              onSuccess: () => {
                navigate(paths.shop.home.getHref(m.shopId));
                if (lastNote.current !== null) toast.dismiss(lastNote.current);
                lastNote.current = toast.show(`Now working in ${m.shopName}.`, 'info');
              },
              onError: (error) => toast.show(errorMessage(error), 'fail'),
            });
          },
        }))}
      />
    </div>
  );
}
