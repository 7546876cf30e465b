// The one place a customer's sell price for a part is decided. Today: the part's list price.
// The purchasing work (price tiers, issue 12) switches this to the company's tier at merge; every
// job line priced for a customer goes through here.
export interface PricedPart {
  listPriceCents: number | null;
}

/** Unit sell price ex GST, in cents, for this customer account (null when the part has no price). */
export function unitPriceFor(_companyId: string, part: PricedPart): number | null {
  return part.listPriceCents;
}
