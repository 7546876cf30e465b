// en-AU display formats, in one place so every page writes numbers and money the same way.
const AUD = new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD' });
const AUD_FINE = new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD', minimumFractionDigits: 2, maximumFractionDigits: 4 });
const NUMBER = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 3 });
const PROSE_DATE = new Intl.DateTimeFormat('en-AU', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' });

/** Whole-cent money, e.g. 123450 → "$1,234.50". */
export const formatMoney = (cents: number) => AUD.format(cents / 100);

/** Costs may carry fractions of a cent: up to 4 decimals of a dollar, e.g. "$12.3456". */
export const formatCost = (cents: number) => AUD_FINE.format(cents / 100);

export const formatNumber = (n: number) => NUMBER.format(n);

/** A value with its unit, e.g. "102.4 V", "5,120 Wh". */
export const withUnit = (n: number, unit?: string) => (unit ? `${NUMBER.format(n)} ${unit}` : NUMBER.format(n));

/** "2026-12-02" → "2 Dec 2026" (for prose; tables keep the ISO date). */
export function formatProseDate(iso: string) {
  const d = new Date(`${iso.slice(0, 10)}T00:00:00Z`);
  return Number.isNaN(d.getTime()) ? iso : PROSE_DATE.format(d);
}

/** File sizes as people read them: "840 KB", "4.2 MB". */
export function formatBytes(bytes: number) {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / (1024 * 1024)).toLocaleString('en-AU', { maximumFractionDigits: 1 })} MB`;
}
