import { JOB_STATUS_LABELS, type JobStatus } from '@shared/contracts/jobs.ts';
import { StatusTag } from '@/components/ui/notice.tsx';

const LOOK: Record<JobStatus, { tone: 'info' | 'good' | 'caution' | 'danger'; icon: string }> = {
  draft: { tone: 'info', icon: '✎' },
  ordered: { tone: 'info', icon: '●' },
  reserved: { tone: 'good', icon: '✓' },
  'part-reserved': { tone: 'caution', icon: '◐' },
  picking: { tone: 'info', icon: '⇄' },
  ready: { tone: 'good', icon: '▣' },
  dispatched: { tone: 'good', icon: '→' },
  collected: { tone: 'good', icon: '✓' },
  closed: { tone: 'info', icon: '■' },
  cancelled: { tone: 'danger', icon: '✕' },
};

/** A job's status as text and shape, never colour alone. */
export function JobStatusTag({ status }: { status: JobStatus }) {
  const look = LOOK[status];
  return (
    <StatusTag tone={look.tone} icon={look.icon}>
      {JOB_STATUS_LABELS[status]}
    </StatusTag>
  );
}
