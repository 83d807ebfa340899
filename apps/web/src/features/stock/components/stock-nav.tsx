import { cn } from '@tappet/ui';
import { NavLink } from 'react-router-dom';
import { paths } from '../../../config/paths';

/** The stock screens' own navigation: lines, movements, holds, bins and value. */
export function StockNav({ shopId }: { shopId: string }) {
  const items = [
    { to: paths.shop.stock.getHref(shopId), label: 'Stock', end: true },
    { to: paths.shop.stockMovements.getHref(shopId), label: 'Movements' },
    { to: paths.shop.stockHolds.getHref(shopId), label: 'Holds' },
    { to: paths.shop.stockBins.getHref(shopId), label: 'Bins' },
    { to: paths.shop.stockValue.getHref(shopId), label: 'Value' },
  ];
  return (
    <nav aria-label="Stock" className="mb-6 border-b-2 border-line">
      <ul className="-mb-0.5 flex flex-wrap gap-1">
        {items.map((item) => (
          <li key={item.label}>
            <NavLink
              to={item.to}
              end={item.end}
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
