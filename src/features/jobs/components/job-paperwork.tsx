import { useState } from 'react';
import { useNavigate } from 'react-router';
import type { Job } from '@shared/contracts/jobs.ts';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate, formatMoney } from '@/lib/format.ts';
import { useStartPayment } from '../api/start-payment.ts';
import { useReorderJob } from '../api/reorder-job.ts';

const linkButton = 'inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft';

/**
 * How the job is paid (card or trade terms) and what to do about it, the tax invoice once the job
 * is ordered, and ordering the same again. `justPaid` is set when the checkout sent the user back.
 */
export function JobPaperwork({ job, justPaid }: { job: Job; justPaid: boolean }) {
  const pay = useStartPayment(job.id);
  const reorder = useReorderJob(job.id);
  const navigate = useNavigate();
  const [problem, setProblem] = useState<string | null>(null);
  const waitingForConfirmation = justPaid && !job.payment;

  const startPayment = () => {
    setProblem(null);
    pay.mutate(undefined, { onSuccess: (p) => window.location.assign(p.checkoutUrl), onError: (e) => setProblem(e.message) });
  };
  const orderAgain = () => {
    setProblem(null);
    reorder.mutate(undefined, { onSuccess: (j) => navigate(paths.job.href(j.id)), onError: (e) => setProblem(e.message) });
  };

  return (
    <section aria-labelledby="paperwork-heading" className="no-print space-y-2">
      <h2 id="paperwork-heading" className="sr-only">
        Payment and paperwork
      </h2>
      {job.payment?.status === 'paid' && <Notice tone="good">Paid by card: {formatMoney(job.payment.amountCents)} on {formatDate(job.payment.paidAt)}.</Notice>}
      {job.payment?.status === 'refunded' && <Notice tone="info">The card payment of {formatMoney(job.payment.amountCents)} was refunded when the job was cancelled.</Notice>}
      {waitingForConfirmation && (
        <Notice tone="info" title="Payment sent">
          We are waiting for the card provider to confirm it; this page updates by itself.
        </Notice>
      )}
      {job.abilities.pay && !waitingForConfirmation && (
        <Notice tone="caution" title="Pay by card to place this order">
          {job.company.name} pays by card: the order goes to the warehouse once the payment is confirmed.
          {job.totals.totalCents > 0 ? ` Total ${formatMoney(job.totals.totalCents)} inc GST.` : ' The plan’s lines are priced when you pay; the checkout shows the total inc GST.'}
        </Notice>
      )}
      <div className="flex flex-wrap gap-2">
        {job.abilities.pay && !waitingForConfirmation && (
          <Button variant="primary" onClick={startPayment} disabled={pay.isPending}>
            {pay.isPending ? 'Opening the checkout…' : 'Pay by card'}
          </Button>
        )}
        {job.abilities.invoice && (
          <a className={linkButton} href={`/api/jobs/${encodeURIComponent(job.id)}/invoice.pdf`} target="_blank" rel="noopener">
            Tax invoice (PDF)
          </a>
        )}
        {job.abilities.reorder && (
          <Button onClick={orderAgain} disabled={reorder.isPending}>
            {reorder.isPending ? 'Copying…' : 'Order the same again'}
          </Button>
        )}
      </div>
      {job.paymentTerms === 'trade' && job.status !== 'draft' && job.status !== 'cancelled' && <p className="text-sm text-ink-soft">Invoiced to the trade account on its agreed terms.</p>}
      {problem && <Notice tone="danger">{problem}</Notice>}
    </section>
  );
}
