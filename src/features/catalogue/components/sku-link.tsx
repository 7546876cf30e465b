import type { MouseEvent } from 'react';
import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';

/** A part's SKU as a link to its page, in the mono face people compare codes in. */
export function SkuLink({ sku, className = '', tabIndex, onClick }: { sku: string; className?: string; tabIndex?: number; onClick?: (e: MouseEvent) => void }) {
  return (
    <Link to={paths.part.href(sku)} tabIndex={tabIndex} onClick={onClick} className={`num whitespace-nowrap font-semibold text-ink hover:text-copper hover:underline ${className}`}>
      {sku}
    </Link>
  );
}
