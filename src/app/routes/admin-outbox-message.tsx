import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { MAIL_EVENT_LABELS } from '@shared/contracts/mail.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate } from '@/lib/format.ts';
import { useOutboxMessage } from '@/features/mail/api/get-outbox-message.ts';
import { MailStatusTag } from '@/features/mail/components/mail-status.tsx';

/** One message as it was sent: the HTML part in a sandboxed frame (no scripts, no same-origin), or the text part. */
export function AdminOutboxMessageRoute() {
  const { id = '' } = useParams();
  const { data: m, error } = useOutboxMessage(id);
  const [part, setPart] = useState<'html' | 'text'>('html');
  const back = (
    <Link to={paths.outbox.href()} className="inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
      Outbox
    </Link>
  );
  if (error || !m)
    return (
      <Page title="Message" actions={back}>
        {error ? <Notice tone="danger">{error.message}</Notice> : <p className="text-sm text-ink-soft">Loading the message…</p>}
      </Page>
    );
  return (
    <Page title={m.subject} subtitle={<span className="break-all">To {m.to}</span>} actions={back}>
      <div className="space-y-3">
        <Card className="flex flex-wrap items-center gap-x-6 gap-y-2 py-3 text-sm">
          <MailStatusTag status={m.status} />
          <span>{MAIL_EVENT_LABELS[m.event]}</span>
          <span>Written {formatDate(m.createdAt)}</span>
          {m.sentAt && <span>Sent {formatDate(m.sentAt)}</span>}
          <span>
            {m.attempts} attempt{m.attempts === 1 ? '' : 's'}
          </span>
        </Card>
        {m.lastError && <Notice tone={m.status === 'sent' ? 'info' : 'danger'} title="The mail server said">{m.lastError}</Notice>}
        <div role="group" aria-label="Which part to show" className="flex gap-2">
          <Button variant={part === 'html' ? 'primary' : 'secondary'} aria-pressed={part === 'html'} onClick={() => setPart('html')}>
            HTML
          </Button>
          <Button variant={part === 'text' ? 'primary' : 'secondary'} aria-pressed={part === 'text'} onClick={() => setPart('text')}>
            Plain text
          </Button>
        </div>
        {part === 'html' ? (
          <iframe title={`HTML part of “${m.subject}”`} sandbox="" srcDoc={m.html} className="h-[70vh] w-full rounded-md border border-line bg-white" />
        ) : (
          <pre className="overflow-x-auto rounded-md border border-line bg-card p-4 text-sm break-words whitespace-pre-wrap">{m.text}</pre>
        )}
      </div>
    </Page>
  );
}
