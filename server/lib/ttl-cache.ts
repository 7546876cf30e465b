/**
 * A small in-process cache for data that is read on every request but rarely changes.
 * Entries expire after `ttlMs`, so other server instances see a change within that time;
 * this instance clears it at once when it makes the change itself.
 */
export function createTtlCache<V>(ttlMs: number, { maxEntries = 10_000, keep = (_v: V): boolean => true }: { maxEntries?: number; keep?: (v: V) => boolean } = {}) {
  const entries = new Map<string, { value: Promise<V>; expires: number }>();
  const sweep = (now: number) => {
    for (const [k, e] of entries) if (e.expires <= now) entries.delete(k);
    if (entries.size >= maxEntries) entries.clear();
  };
  return {
    get(key: string, load: () => Promise<V>): Promise<V> {
      const now = Date.now();
      const hit = entries.get(key);
      if (hit && hit.expires > now) return hit.value;
      if (entries.size >= maxEntries) sweep(now);
      const value = load();
      entries.set(key, { value, expires: now + ttlMs });
      // Failures and values `keep` refuses (unknown session cookies) are not remembered.
      value.then((v) => !keep(v) && entries.delete(key), () => entries.delete(key));
      return value;
    },
    clear() {
      entries.clear();
    },
  };
}

export type TtlCache<V> = ReturnType<typeof createTtlCache<V>>;
