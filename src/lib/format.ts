// Display formats, in one place so every page writes numbers, money and dates the same way.
import { centsToDollars, formatCents } from '@shared/domain/money.ts';

const AUD_FINE = new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD', minimumFractionDigits: 2, maximumFractionDigits: 4 });
const NUMBER = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 3 });
/** Dates follow the reader's own locale (the browser's), Australian English when it has none. */
const DATE_LOCALE = (typeof navigator !== 'undefined' && navigator.language) || 'en-AU';
const DATE_OPTIONS = { day: 'numeric', month: 'short', year: 'numeric' } as const;
const CALENDAR_DATE = new Intl.DateTimeFormat(DATE_LOCALE, { ...DATE_OPTIONS, timeZone: 'UTC' });
const MOMENT_DATE = new Intl.DateTimeFormat(DATE_LOCALE, DATE_OPTIONS);

/** Whole-cent money, e.g. 123450 → "$1,234.50". */
export const formatMoney = (cents: number) => formatCents(cents);

/** Costs may carry fractions of a cent: up to 4 decimals of a dollar, e.g. "$12.3456" (formatted from the exact decimal string). */
export const formatCost = (cents: number) => AUD_FINE.format(centsToDollars(cents) as unknown as number);

export const formatNumber = (n: number) => NUMBER.format(n);

/** A value with its unit, e.g. "102.4 V", "5,120 Wh". */
export const withUnit = (n: number, unit?: string) => (unit ? `${NUMBER.format(n)} ${unit}` : NUMBER.format(n));

/**
 * The one date format: "2026-12-02" → "2 Dec 2026" in en-AU. A calendar date (YYYY-MM-DD) is that
 * day wherever the reader is; a moment (an ISO timestamp, a Date) is its day where the reader is.
 */
export function formatDate(value: string | Date) {
  if (typeof value === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(value)) return CALENDAR_DATE.format(new Date(`${value}T00:00:00Z`));
  const d = typeof value === 'string' ? new Date(value) : value;
  return Number.isNaN(d.getTime()) ? String(value) : MOMENT_DATE.format(d);
}

const MOMENT_TIME = new Intl.DateTimeFormat(DATE_LOCALE, { ...DATE_OPTIONS, hour: 'numeric', minute: '2-digit' });

/** A moment with its time of day, where the reader is: "3 Dec 2026, 4:55 pm" in en-AU. */
export function formatDateTime(value: string | Date) {
  const d = typeof value === 'string' ? new Date(value) : value;
  return Number.isNaN(d.getTime()) ? String(value) : MOMENT_TIME.format(d);
}

/** File sizes as people read them: "840 KB", "4.2 MB". */
export function formatBytes(bytes: number) {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / (1024 * 1024)).toLocaleString('en-AU', { maximumFractionDigits: 1 })} MB`;
}
