import { NavLink } from 'react-router';
import { paths } from '@/config/paths.ts';

const TABS = [
  { label: 'Price lists', href: paths.priceLists.href(), end: true },
  { label: 'Suppliers', href: paths.suppliers.href() },
  { label: 'Sell pricing', href: paths.pricing.href() },
  { label: 'Reorder', href: paths.reorder.href() },
  { label: 'Orders', href: paths.purchaseOrders.href() },
];

/** The purchasing pages, one row of links (wraps on a phone). */
export function PurchasingTabs() {
  return (
    <nav aria-label="Purchasing" className="mb-4 flex flex-wrap gap-1 border-b border-line">
      {TABS.map((t) => (
        <NavLink key={t.href} to={t.href} end={t.end} className={({ isActive }) => `-mb-px border-b-2 px-3 py-1.5 text-sm font-medium ${isActive ? 'border-copper text-ink' : 'border-transparent text-ink-soft hover:text-ink'}`}>
          {t.label}
        </NavLink>
      ))}
    </nav>
  );
}
