// Work arrays reused from one search to the next. A search over 50,000 documents needs several
// arrays of that length that are dead once it returns; allocating them afresh each time costs
// more than the work done in them (zeroed pages, then garbage collection). Searches run
// synchronously one at a time, so one set per purpose is enough. What a search returns or keeps
// is copied out of these (`slice`), never handed out.

type Typed = Uint8Array | Uint16Array | Uint32Array | Int32Array | Float64Array;

const pools = new Map<string, Typed>();

function take<T extends Typed>(purpose: string, size: number, make: (size: number) => T): T {
  const held = pools.get(purpose) as T | undefined;
  if (held && held.length >= size) return held;
  // Grow with headroom, so a growing index does not reallocate on every write.
  const grown = make(Math.max(1024, Math.ceil(size * 1.25)));
  pools.set(purpose, grown);
  return grown;
}

export const scratch = {
  /** Contents are left from earlier use: callers write before they read. */
  int32: (purpose: string, size: number) => take(purpose, size, (n) => new Int32Array(n)),
  float64: (purpose: string, size: number) => take(purpose, size, (n) => new Float64Array(n)),
  uint16: (purpose: string, size: number) => take(purpose, size, (n) => new Uint16Array(n)),
  uint8: (purpose: string, size: number) => take(purpose, size, (n) => new Uint8Array(n)),
  uint32: (purpose: string, size: number) => take(purpose, size, (n) => new Uint32Array(n)),
  /** Zeroed over [0, size). */
  zeroedUint8: (purpose: string, size: number) => take(purpose, size, (n) => new Uint8Array(n)).fill(0, 0, size),
};
