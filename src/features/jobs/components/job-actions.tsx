import { useState } from 'react';
import type { Job } from '@shared/contracts/jobs.ts';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { useJobAction, type JobAction } from '../api/job-action.ts';

const LABELS: Record<JobAction, { label: string; busy: string; variant: 'primary' | 'secondary' | 'danger' }> = {
  order: { label: 'Place order', busy: 'Ordering…', variant: 'primary' },
  reserve: { label: 'Reserve stock', busy: 'Reserving…', variant: 'primary' },
  release: { label: 'Release stock', busy: 'Releasing…', variant: 'secondary' },
  cancel: { label: 'Cancel job', busy: 'Cancelling…', variant: 'danger' },
  dispatch: { label: 'Sent with a carrier', busy: 'Recording…', variant: 'primary' },
  collect: { label: 'Collected at the counter', busy: 'Recording…', variant: 'primary' },
  close: { label: 'Close job', busy: 'Closing…', variant: 'secondary' },
  gather: { label: 'Move held stock to this job’s warehouse', busy: 'Moving…', variant: 'secondary' },
};

/** The buttons the server says this user may press now (the job's `abilities`). */
export function JobActions({ job }: { job: Job }) {
  const run = useJobAction(job.id);
  const [problem, setProblem] = useState<string | null>(null);
  const actions = (Object.keys(LABELS) as JobAction[]).filter((a) => job.abilities[a]);
  if (actions.length === 0) return null;
  const press = (a: JobAction) => {
    if (a === 'cancel' && !window.confirm(`Cancel job ${job.reference}? Its reserved stock goes back on the shelf.`)) return;
    setProblem(null);
    run.mutate(a, { onError: (e) => setProblem(e.message) });
  };
  return (
    <div className="no-print space-y-2">
      <div className="flex flex-wrap gap-2">
        {actions.map((a) => (
          <Button key={a} variant={LABELS[a].variant} disabled={run.isPending} onClick={() => press(a)}>
            {run.isPending && run.variables === a ? LABELS[a].busy : a === 'reserve' && job.status === 'draft' ? 'Hold stock for this quote' : LABELS[a].label}
          </Button>
        ))}
      </div>
      {problem && <Notice tone="danger">{problem}</Notice>}
    </div>
  );
}
