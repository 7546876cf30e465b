import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { usePickQueue } from '@/features/warehouse/api/get-pick-queue.ts';
import { PickQueueTable } from '@/features/warehouse/components/pick-queue-table.tsx';

export function PickQueueRoute() {
  const queue = usePickQueue();
  return (
    <Page title="Pick queue" subtitle="Reserved jobs, oldest order first. Open one to pick it by scanning.">
      {queue.error && <Notice tone="danger">{queue.error.message}</Notice>}
      {queue.data ? <PickQueueTable items={queue.data} /> : !queue.error && <p className="text-sm text-ink-soft">Loading the pick queue…</p>}
    </Page>
  );
}
