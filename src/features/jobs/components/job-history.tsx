import { JOB_STATUS_LABELS, type Job } from '@shared/contracts/jobs.ts';
import { formatDateTime } from '@/lib/format.ts';

/** Every step the job took: who and when. */
export function JobHistory({ history }: { history: Job['history'] }) {
  return (
    <ol className="space-y-1 text-sm" aria-label="History">
      {history.map((h, i) => (
        <li key={i} className="flex flex-wrap gap-x-2">
          <span className="num text-ink-soft">{formatDateTime(h.at)}</span>
          <span className="font-semibold">{JOB_STATUS_LABELS[h.status]}</span>
          <span className="text-ink-soft">{h.by ? `by ${h.by}` : 'by Stackyard'}</span>
          {h.note && <span>— {h.note}</span>}
        </li>
      ))}
    </ol>
  );
}
