import type { Lifecycle } from '@shared/contracts/parts.ts';
import { StatusTag } from '@/components/ui/notice.tsx';
import { formatNumber } from '@/lib/format.ts';

/** Active parts carry no tag (it is the normal case); the others are marked with a shape and a word. */
export function LifecycleTag({ lifecycle, showActive = false }: { lifecycle: Lifecycle; showActive?: boolean }) {
  if (lifecycle === 'superseded')
    return (
      <StatusTag tone="caution" icon="↷">
        Superseded
      </StatusTag>
    );
  if (lifecycle === 'discontinued')
    return (
      <StatusTag tone="danger" icon="⊘">
        Discontinued
      </StatusTag>
    );
  return showActive ? (
    <StatusTag tone="good" icon="●">
      Active
    </StatusTag>
  ) : (
    <span className="text-xs text-ink-soft">Active</span>
  );
}

/** Available quantity: a number when there is some, "0 · none" with a cross when there is none. */
export function AvailableQty({ available }: { available: number }) {
  if (available > 0) return <span className="num text-teal">{formatNumber(available)}</span>;
  return (
    <span className="num inline-flex items-center gap-1 whitespace-nowrap font-semibold text-danger">
      <span aria-hidden="true">✕</span>0 · none
    </span>
  );
}
