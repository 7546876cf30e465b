import { z } from 'zod';

/**
 * Text PostgreSQL and every other system downstream can store and show: no NUL character
 * (PostgreSQL refuses it in text) and no unpaired UTF-16 surrogate (not a character at all;
 * it cannot be written as UTF-8). Everything else, right-to-left text and emoji included, is fine.
 */
export function isCleanText(value: string): boolean {
  for (let i = 0; i < value.length; i++) {
    const c = value.charCodeAt(i);
    if (c === 0) return false;
    if (c >= 0xd800 && c <= 0xdbff) {
      const next = value.charCodeAt(i + 1);
      if (!(next >= 0xdc00 && next <= 0xdfff)) return false;
      i++; // a proper pair
    } else if (c >= 0xdc00 && c <= 0xdfff) return false;
  }
  return true;
}

export const UNCLEAN_TEXT_MESSAGE = 'Text cannot contain NUL characters or broken Unicode (an unpaired surrogate).';

/**
 * The one string schema every contract uses (lint refuses a bare `z.string()` in shared/contracts).
 * Chain the usual string checks on it: `text().trim().min(1).max(100)`.
 */
export function text(params?: Parameters<typeof z.string>[0]) {
  return z.string(params).refine(isCleanText, { message: UNCLEAN_TEXT_MESSAGE, abort: true });
}
