// Dates on paper and in e-mail: the business's day (Melbourne), whatever the server's clock zone.
const FORMATS = {
  short: new Intl.DateTimeFormat('en-AU', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'Australia/Melbourne' }),
  long: new Intl.DateTimeFormat('en-AU', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'Australia/Melbourne' }),
};

/** "3 Dec 2026" (or "3 December 2026" with `long`). */
export const businessDate = (d: Date | string, month: keyof typeof FORMATS = 'short') => FORMATS[month].format(typeof d === 'string' ? new Date(d) : d);
