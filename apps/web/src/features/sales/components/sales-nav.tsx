import { cn } from '@tappet/ui';
import { NavLink } from 'react-router-dom';
import { paths } from '../../../config/paths';

/** The sales screens' own navigation. */
export function SalesNav({ shopId, canSell }: { shopId: string; canSell: boolean }) {
  const items = [
    { to: paths.shop.salesInvoices.getHref(shopId), label: 'Invoices', end: true },
    ...(canSell ? [{ to: paths.shop.salesCounter.getHref(shopId), label: 'Counter sale', end: true }] : []),
    { to: paths.shop.salesPricing.getHref(shopId), label: 'Pricing rules', end: true },
  ];
  return (
    <nav aria-label="Sales" className="mb-6 border-b-2 border-line">
      <ul className="-mb-0.5 flex flex-wrap gap-1">
        {items.map((item) => (
          <li key={item.label}>
            <NavLink
              to={item.to}
              end={item.end}
              className={({ isActive }) => cn('flex min-h-touch items-center border-b-4 px-4 font-bold no-underline', isActive ? 'border-accent text-ink' : 'border-transparent text-ink-muted hover:text-ink')}
            >
              {item.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
