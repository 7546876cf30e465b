import { Link, useParams } from 'react-router';
import { useQuery } from '@tanstack/react-query';
import { Page, PageLoading } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { formatDate } from '@/lib/format.ts';
import { useRanges } from '@/features/catalogue/api/get-ranges.ts';
import { partQueryOptions } from '@/features/catalogue/api/get-part.ts';
import { useSavedPlan } from '@/features/planner/api/get-saved-plan.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useInverters } from '@/features/planner/api/get-inverters.ts';
import { fromServer } from '@/features/planner/lib/plan-view.ts';
import { siteParams } from '@/features/planner/hooks/use-planner-params.ts';
import { SiteInputSchema } from '@shared/domain/site.ts';
import { PlanActions } from '@/features/planner/components/plan-actions.tsx';
import { PlanSheet } from '@/features/planner/components/plan-sheet.tsx';

/** The planner's URL for a saved request, so the plan can be reworked from where it was left. */
function plannerSearch(request: Record<string, unknown>, rangeCode: string) {
  const s = new URLSearchParams({ range: rangeCode });
  if (typeof request.targetUsableKwh === 'number' && request.modules === undefined) {
    s.set('mode', 'target');
    s.set('kwh', String(request.targetUsableKwh));
  } else if (typeof request.modules === 'number') {
    s.set('modules', String(request.modules));
    s.set('stacks', String(request.stacks ?? 1));
  }
  if (typeof request.inverterSku === 'string') s.set('inverter', request.inverterSku);
  if (request.includeInverter === true) s.set('includeInverter', 'yes');
  const site = SiteInputSchema.safeParse(request.site);
  for (const [k, v] of Object.entries(siteParams(site.success ? site.data : undefined))) if (v) s.set(k, String(v));
  return s.toString();
}

export function SavedPlanRoute() {
  const { id = '' } = useParams();
  const saved = useSavedPlan(id);
  const { data: me } = useMe();
  const { data: inverters = [] } = useInverters();
  const { data: ranges = [] } = useRanges();
  const plan = saved.data?.plan;
  const controllerSku = plan?.units.find((u) => u.kind === 'controller')?.sku ?? '';
  const controller = useQuery({ ...partQueryOptions(controllerSku), enabled: !!controllerSku });
  const inverter = plan?.inverterSku ? (inverters.find((i) => i.sku === plan.inverterSku) ?? null) : null;
  const rangeCode = ranges.find((r) => r.id === plan?.rangeId)?.code;

  if (saved.error) {
    return (
      <Page title="Saved plan">
        <Notice tone="danger">{saved.error.message}</Notice>
        <p className="mt-3 text-sm">
          <Link to={paths.plans.href()} className="text-copper underline">
            Back to saved plans
          </Link>
        </p>
      </Page>
    );
  }
  if (!saved.data || !plan) {
    return <PageLoading title="Saved plan" what="the plan" />;
  }
  const s = saved.data;
  const site = [s.siteSuburb, s.sitePostcode].filter(Boolean).join(' ');
  return (
    <Page
      title={s.name}
      subtitle={
        <>
          Draft for {s.companyName}
          {site ? ` · site ${site}` : ''} · {s.rangeName} · saved by {s.createdBy} on {formatDate(s.createdAt)}
        </>
      }
      actions={
        <span className="no-print flex gap-2">
          <Link to={paths.plans.href()} className="inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
            All saved plans
          </Link>
          {hasAbility(me, 'jobs.create') && (
            <Link to={paths.jobNew.href(s.id)} className="inline-flex items-center rounded-md border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
              Order this plan
            </Link>
          )}
          {rangeCode && (
            <Link to={paths.planner.href(plannerSearch(s.request, rangeCode))} className="inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
              Open in planner
            </Link>
          )}
        </span>
      }
    >
      <div className="space-y-4">
        <Notice>Recomputed just now with today’s parts and stock.</Notice>
        <PlanActions source={{ savedId: s.id }} />
        <PlanSheet plan={fromServer(plan)} inverter={inverter} controllerHasDisplay={controller.data?.attributes.hasDisplay === true} />
      </div>
    </Page>
  );
}
