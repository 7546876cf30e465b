import type { MailStatus } from '@shared/contracts/mail.ts';
import { StatusTag } from '@/components/ui/notice.tsx';

const LOOK: Record<MailStatus, { tone: 'info' | 'good' | 'caution' | 'danger'; icon: string; label: string }> = {
  queued: { tone: 'info', icon: '…', label: 'Waiting' },
  sending: { tone: 'info', icon: '→', label: 'Sending' },
  sent: { tone: 'good', icon: '✓', label: 'Sent' },
  retrying: { tone: 'caution', icon: '↻', label: 'Trying again' },
  failed: { tone: 'danger', icon: '✕', label: 'Not delivered' },
};

/** A message's state as text and shape, never colour alone. */
export function MailStatusTag({ status }: { status: MailStatus }) {
  const look = LOOK[status];
  return (
    <StatusTag tone={look.tone} icon={look.icon}>
      {look.label}
    </StatusTag>
  );
}
