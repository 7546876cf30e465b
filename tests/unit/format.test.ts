// The client's one date format and money display, outside the browser (en-AU, the default locale).
import { describe, expect, it } from 'vitest';
import { formatCost, formatDate, formatDateTime, formatMoney } from '../../src/lib/format.ts';

describe('dates', () => {
  it('writes a calendar date and a timestamp the same way', () => {
    // Intl en-AU medium date, as the CLDR data has it: day, short month, year.
    expect(formatDate('2026-12-03')).toBe('3 Dec 2026');
    expect(formatDate('2026-01-09')).toBe('9 Jan 2026');
    // A calendar date is that day wherever the reader is (no shift to the day before in UTC−).
    expect(formatDate(new Date(2026, 11, 3, 12))).toBe('3 Dec 2026');
    expect(formatDate('not a date')).toBe('not a date');
  });

  it('writes a moment with its time of day in the reader\'s zone', () => {
    // CLDR en-AU: the date as above, then h:mm with a lower-case am/pm (Node's ICU data).
    expect(formatDateTime(new Date(2026, 11, 3, 16, 55))).toMatch(/^3 Dec 2026, 4:55\s?pm$/);
    expect(formatDateTime(new Date(2026, 0, 9, 9, 5))).toMatch(/^9 Jan 2026, 9:05\s?am$/);
    expect(formatDateTime('nonsense')).toBe('nonsense');
  });
});

describe('money on screen', () => {
  it('formats whole cents and fine costs from exact decimals', () => {
    // Intl en-AU currency format (common practice): $ and thousands separators.
    expect(formatMoney(123450)).toBe('$1,234.50');
    expect(formatCost(1234.56)).toBe('$12.3456');
    expect(formatCost(29)).toBe('$0.29');
  });
});
