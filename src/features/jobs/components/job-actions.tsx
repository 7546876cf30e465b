import { useState, type FormEvent } from 'react';
import type { Job } from '@shared/contracts/jobs.ts';
import { Button } from '@/components/ui/button.tsx';
import { TextField } from '@/components/ui/field.tsx';
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
  const [sending, setSending] = useState(false);
  const actions = (Object.keys(LABELS) as JobAction[]).filter((a) => job.abilities[a]);
  if (actions.length === 0) return null;
  const onError = (e: Error) => setProblem(e.message);
  const press = (a: JobAction) => {
    if (a === 'cancel' && !window.confirm(`Cancel job ${job.reference}? Its reserved stock goes back on the shelf.`)) return;
    setProblem(null);
    // A dispatch first asks who took it, so the customer's e-mail can say.
    if (a === 'dispatch') return setSending(true);
    run.mutate({ action: a }, { onError });
  };
  const dispatch = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const field = (k: string) => String(form.get(k) ?? '').trim() || undefined;
    run.mutate({ action: 'dispatch', sent: { carrier: field('carrier'), trackingRef: field('trackingRef') } }, { onError, onSuccess: () => setSending(false) });
  };
  return (
    <div className="no-print space-y-2">
      {sending ? (
        <form onSubmit={dispatch} className="space-y-2 rounded border border-line bg-card p-3" aria-label="Record the dispatch">
          <p className="text-sm">Who took the kit? Both are optional; the customer’s e-mail includes them.</p>
          <div className="grid gap-2 sm:grid-cols-2">
            <TextField label="Carrier" name="carrier" maxLength={60} autoComplete="off" />
            <TextField label="Tracking reference" name="trackingRef" maxLength={60} mono autoComplete="off" />
          </div>
          <div className="flex flex-wrap gap-2">
            <Button type="submit" variant="primary" disabled={run.isPending}>{run.isPending ? LABELS.dispatch.busy : 'Record dispatch'}</Button>
            <Button type="button" onClick={() => setSending(false)} disabled={run.isPending}>Back</Button>
          </div>
        </form>
      ) : (
        <div className="flex flex-wrap gap-2">
          {actions.map((a) => (
            <Button key={a} variant={LABELS[a].variant} disabled={run.isPending} onClick={() => press(a)}>
              {run.isPending && run.variables?.action === a ? LABELS[a].busy : a === 'reserve' && job.status === 'draft' ? 'Hold stock for this quote' : LABELS[a].label}
            </Button>
          ))}
        </div>
      )}
      {problem && <Notice tone="danger">{problem}</Notice>}
    </div>
  );
}
