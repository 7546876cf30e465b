/** A real progress bar (role progressbar) with the figures beside it as text. */
export function ProgressBar({ label, done, total }: { label: string; done: number; total: number }) {
  const pct = total > 0 ? Math.min(100, Math.round((done / total) * 100)) : 0;
  return (
    <div className="space-y-1">
      <div className="flex justify-between text-xs text-ink-soft">
        <span>{label}</span>
        <span className="num">{total > 0 ? `${pct} %` : '…'}</span>
      </div>
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="h-2 w-full overflow-hidden rounded bg-line">
        <div className="h-full bg-teal transition-[width]" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}
