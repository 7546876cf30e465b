import type { ComponentProps } from 'react';
import { Link } from 'react-router';
import { paths } from '@/config/paths.ts';

/** A part's SKU as a link to its page, in the mono face people compare codes in. */
export function SkuLink({ sku, className = '', ...rest }: { sku: string } & Omit<ComponentProps<typeof Link>, 'to' | 'children'>) {
  return (
    <Link to={paths.part.href(sku)} className={`num whitespace-nowrap font-semibold text-ink hover:text-copper hover:underline ${className}`} {...rest}>
      {sku}
    </Link>
  );
}
