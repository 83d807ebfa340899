import { cn } from '@tappet/ui';
import { NavLink } from 'react-router-dom';
import { paths } from '../../../config/paths';

/** The purchasing screens' own navigation. */
export function PurchasingNav({ shopId }: { shopId: string }) {
  const items = [
    { to: paths.shop.purchasingReorder.getHref(shopId), label: 'Reorder list' },
    { to: paths.shop.purchasingOrders.getHref(shopId), label: 'Orders' },
    { to: paths.shop.purchasingSuppliers.getHref(shopId), label: 'Suppliers' },
    { to: paths.shop.purchasingReturns.getHref(shopId), label: 'Returns' },
  ];
  return (
    <nav aria-label="Purchasing" className="mb-6 border-b-2 border-line">
      <ul className="-mb-0.5 flex flex-wrap gap-1">
        {items.map((item) => (
          <li key={item.label}>
            <NavLink
              to={item.to}
              className={({ isActive }) =>
                cn('flex min-h-touch items-center border-b-4 px-4 font-bold no-underline', isActive ? 'border-accent text-ink' : 'border-transparent text-ink-muted hover:text-ink')
              }
            >
              {item.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
