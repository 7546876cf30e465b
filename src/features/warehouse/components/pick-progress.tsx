import type { PickProgress } from '@shared/contracts/warehouse.ts';

/** Units picked of units needed, as a bar and in words. */
export function PickProgressBar({ progress, large = false }: { progress: PickProgress; large?: boolean }) {
  const pct = progress.units ? Math.round((progress.picked / progress.units) * 100) : 0;
  return (
    <div>
      <p className={`num ${large ? 'text-xl font-semibold' : 'text-sm'}`}>
        {progress.picked} of {progress.units} units · {progress.linesDone} of {progress.lines} lines
      </p>
      <div role="progressbar" aria-label="Pick progress" aria-valuemin={0} aria-valuemax={progress.units} aria-valuenow={progress.picked} className={`mt-1 w-full overflow-hidden rounded-full border border-line bg-card ${large ? 'h-4' : 'h-2'}`}>
        <div className="h-full bg-teal" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}
