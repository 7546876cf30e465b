// Sell prices from costs (domain.md §5): cost × (1 + markup) or the supplier's list price,
// less the customer's tier discount; all ex GST, in whole cents, decimal arithmetic.
import Decimal from 'decimal.js';
import type { PriceBasis } from '../contracts/purchasing.ts';
import { roundCents } from './money.ts';

export interface PriceInputs {
  basis: PriceBasis;
  markupPct: Decimal.Value;
  /** Unit cost in cents, possibly with two further decimals (4-dp costs). */
  costCents: number | null;
  /** The supplier's recommended sell price, whole cents. */
  supplierListCents: number | null;
}

/** The list (sell) price ex GST in whole cents, or null when the basis has nothing to work from. */
export function listPriceFrom({ basis, markupPct, costCents, supplierListCents }: PriceInputs): number | null {
  if (basis === 'supplier-list') return supplierListCents;
  if (costCents === null) return null;
  return roundCents(new Decimal(costCents).times(new Decimal(markupPct).dividedBy(100).plus(1)));
}

/** A customer's price: the list price less their tier discount, to the nearest cent (half up). */
export function discountedCents(listCents: number, discountPct: Decimal.Value): number {
  return roundCents(new Decimal(listCents).times(new Decimal(100).minus(discountPct)).dividedBy(100));
}
