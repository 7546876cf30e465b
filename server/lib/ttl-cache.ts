/**
 * A small in-process cache for data that is read on every request but rarely changes.
 * Entries expire after `ttlMs`, so other server instances see a change within that time;
 * this instance clears it at once when it makes the change itself.
 */
export function createTtlCache<V>(ttlMs: number) {
  const entries = new Map<string, { value: Promise<V>; expires: number }>();
  return {
    get(key: string, load: () => Promise<V>): Promise<V> {
      const hit = entries.get(key);
      if (hit && hit.expires > Date.now()) return hit.value;
      const value = load();
      entries.set(key, { value, expires: Date.now() + ttlMs });
      value.catch(() => entries.delete(key));
      return value;
    },
    clear() {
      entries.clear();
    },
  };
}

export type TtlCache<V> = ReturnType<typeof createTtlCache<V>>;
