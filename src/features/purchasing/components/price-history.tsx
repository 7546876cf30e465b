import { formatCost, formatDate } from '@/lib/format.ts';
import type { PriceHistoryEntry } from '../api/suppliers.ts';

/** A supplier part's cost over time: a small step chart (oldest left) and the list beside it. */
export function PriceHistory({ entries }: { entries: PriceHistoryEntry[] }) {
  if (entries.length === 0) return <p className="text-sm text-ink-soft">No cost recorded yet.</p>;
  const oldestFirst = [...entries].reverse();
  const costs = oldestFirst.map((e) => e.costCents);
  const lo = Math.min(...costs);
  const hi = Math.max(...costs);
  const w = 240;
  const h = 60;
  const x = (i: number) => (oldestFirst.length === 1 ? w / 2 : (i / (oldestFirst.length - 1)) * (w - 8) + 4);
  const y = (c: number) => (hi === lo ? h / 2 : h - 6 - ((c - lo) / (hi - lo)) * (h - 12));
  const points = oldestFirst.flatMap((e, i) => (i === 0 ? [`${x(i)},${y(e.costCents)}`] : [`${x(i)},${y(oldestFirst[i - 1]!.costCents)}`, `${x(i)},${y(e.costCents)}`])).join(' ');
  return (
    <div className="flex flex-wrap gap-4">
      <svg width={w} height={h} role="img" aria-label={`Cost from ${formatCost(costs[0]!)} to ${formatCost(costs.at(-1)!)} over ${entries.length} changes`} className="rounded border border-line bg-paper">
        <polyline points={points} fill="none" stroke="currentColor" strokeWidth="2" className="text-teal" />
        {oldestFirst.map((e, i) => <circle key={i} cx={x(i)} cy={y(e.costCents)} r="3" className="fill-copper" />)}
      </svg>
      <ol className="text-sm">
        {entries.map((e, i) => (
          <li key={i}>
            <span className="num font-semibold">{formatCost(e.costCents)}</span> · {formatDate(e.at)}
            {e.by ? <span className="text-ink-soft"> · {e.by}</span> : null}
          </li>
        ))}
      </ol>
    </div>
  );
}
