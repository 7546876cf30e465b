import { useMemo } from 'react';
import { Link, useParams } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import type { PlannerPart } from '@shared/domain/planner.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { useParts } from '@/features/catalogue/api/get-parts.ts';
import { partKeys } from '@/features/catalogue/api/keys.ts';
import { useRange } from '@/features/planner/api/get-range.ts';
import { useInverters } from '@/features/planner/api/get-inverters.ts';
import { RangeForm } from '@/features/planner/components/range-form.tsx';

export function RangeEditRoute() {
  const { code = '' } = useParams();
  const qc = useQueryClient();
  const range = useRange(code);
  const { data: inverters = [] } = useInverters();
  // SKUs to choose from, and the parts the preview needs for rules new to this range.
  const parts = useParts({ pageSize: 200, sort: 'sku' });
  const catalogue = useMemo(() => {
    const out: Record<string, PlannerPart> = {};
    for (const p of parts.data?.data ?? []) out[p.sku] = { sku: p.sku, name: p.name, category: p.category, packSize: p.packSize };
    return out;
  }, [parts.data]);
  const d = range.data;

  return (
    <Page
      title={d ? `Edit range: ${d.name}` : 'Edit range'}
      subtitle={d ? <>{d.makerName} · <span className="num">{d.code}</span></> : undefined}
      actions={
        <Link to={paths.planner.href(`range=${encodeURIComponent(code)}`)} className="inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
          Back to the planner
        </Link>
      }
    >
      {range.error && <Notice tone="danger">{range.error.message}</Notice>}
      {range.isLoading && <p className="text-sm text-ink-soft">Loading the range…</p>}
      {d && !d.abilities.edit && <Notice tone="danger">Your role cannot change ranges. Purchasing or an administrator can.</Notice>}
      {d && d.abilities.edit && (
        <RangeForm key={d.id} detail={d} inverters={inverters} catalogue={catalogue} onSaved={() => qc.invalidateQueries({ queryKey: partKeys.ranges() })} />
      )}
    </Page>
  );
}
