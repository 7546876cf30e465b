import { useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { useQueries, useQuery } from '@tanstack/react-query';
import type { RangeSummary } from '@shared/contracts/parts.ts';
import type { RangeDetail, StackPlanRequest } from '@shared/contracts/stack-plans.ts';
import type { PlannerInverter } from '@shared/domain/planner.ts';
import { Card, Page } from '@/components/ui/page.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useRanges } from '@/features/catalogue/api/get-ranges.ts';
import { partQueryOptions } from '@/features/catalogue/api/get-part.ts';
import { rangeQueryOptions } from '@/features/planner/api/get-range.ts';
import { useInverters, type InverterOption } from '@/features/planner/api/get-inverters.ts';
import { useStackPlan } from '@/features/planner/api/plan-stack.ts';
import { useDebouncedValue } from '@/features/planner/hooks/use-debounced-value.ts';
import { usePlannerParams, numberOrNull, siteFrom, type PlannerParams } from '@/features/planner/hooks/use-planner-params.ts';
import { fromServer, planLocally, withStockFrom } from '@/features/planner/lib/plan-view.ts';
import { RangeCards } from '@/features/planner/components/range-cards.tsx';
import { PlanControls } from '@/features/planner/components/plan-controls.tsx';
import { PlanErrorNotice } from '@/features/planner/components/plan-error.tsx';
import { PlanActions } from '@/features/planner/components/plan-actions.tsx';
import { PlanSheet } from '@/features/planner/components/plan-sheet.tsx';
import { SavePlanForm } from '@/features/planner/components/save-plan-form.tsx';
import { PlanAlternatives } from '@/features/planner/components/plan-alternatives.tsx';
import { formatDate } from '@/lib/format.ts';

/** Long enough to skip the keystrokes in between; the browser's own figures never wait. */
const CONFIRM_PAUSE_MS = 200;

function requestFrom(detail: RangeDetail | undefined, p: PlannerParams): StackPlanRequest | null {
  if (!detail) return null;
  const common: Pick<StackPlanRequest, 'rangeId' | 'inverterSku' | 'site' | 'includeInverter'> = { rangeId: detail.id, inverterSku: p.inverter ?? undefined };
  const site = siteFrom(p);
  if (site) common.site = site;
  if (p.inverter && p.includeInverter) common.includeInverter = true;
  if (p.mode === 'target') {
    const kwh = numberOrNull(p.kwh);
    return kwh === null ? null : { ...common, targetUsableKwh: kwh };
  }
  const modules = numberOrNull(p.modules);
  if (modules === null) return null;
  return { ...common, modules, stacks: numberOrNull(p.stacks) ?? 1 };
}

function plannerInverter(sku: string | undefined | null, inverters: InverterOption[], detail: RangeDetail | undefined): PlannerInverter | null {
  if (!sku) return null;
  return inverters.find((i) => i.sku === sku) ?? detail?.planner.inverters.find((i) => i.sku === sku) ?? null;
}

const clamp = (n: number, min: number, max: number) => Math.min(max, Math.max(min, n));

export function PlannerRoute() {
  const { data: me } = useMe();
  const navigate = useNavigate();
  const { params, update } = usePlannerParams();
  const ranges = useRanges();
  const { data: inverters = [] } = useInverters();
  // Every range's detail, so each card shows its module and switching ranges is instant.
  const detailQueries = useQueries({ queries: (ranges.data ?? []).map((r) => rangeQueryOptions(r.code)) });
  const details: Record<string, RangeDetail | undefined> = {};
  (ranges.data ?? []).forEach((r, i) => (details[r.code] = detailQueries[i]?.data));
  const summary = ranges.data?.find((r) => r.code === params.range) ?? null;
  const detail = summary ? details[summary.code] : undefined;
  const detailError = summary ? detailQueries[ranges.data!.indexOf(summary)]?.error : null;
  const controller = useQuery({ ...partQueryOptions(detail?.controllerSku ?? ''), enabled: !!detail });
  const [saving, setSaving] = useState(false);

  const request = useMemo(() => requestFrom(detail, params), [detail, params]);
  const inverter = plannerInverter(request?.inverterSku, inverters, detail);
  const local = useMemo(() => (detail && request ? planLocally(detail, request, inverter) : null), [detail, request, inverter]);

  // The server confirms what the browser worked out and adds stock; only plans that work are sent.
  const toConfirm = useDebouncedValue(local?.ok ? request : null, CONFIRM_PAUSE_MS);
  const server = useStackPlan(toConfirm);
  const confirmed = !!server.data && !server.isPlaceholderData && JSON.stringify(toConfirm) === JSON.stringify(request);
  const shown = local?.ok ? (confirmed ? fromServer(server.data!) : withStockFrom(local.plan, server.data)) : null;
  const serverProblem = !server.isFetching && server.error && JSON.stringify(toConfirm) === JSON.stringify(request) ? server.error.message : null;

  const choose = (r: RangeSummary) => {
    const modules = numberOrNull(params.modules);
    const stacks = numberOrNull(params.stacks) ?? 1;
    const other = details[r.code];
    const keepInverter = !params.inverter || (other?.inverterSkus ?? []).includes(params.inverter);
    setSaving(false);
    update({
      range: r.code,
      modules: String(clamp(modules ?? r.minModules, r.minModules, r.maxModules)),
      stacks: String(clamp(stacks, 1, r.maxStacks)),
      inverter: keepInverter ? params.inverter : null,
    });
  };

  return (
    <Page
      title="Stack planner"
      subtitle="Choose a range, then a module count or a usable-energy target. The figures follow as you type; stock is checked against the warehouses."
      actions={
        detail?.abilities.edit ? (
          <Link to={paths.rangeEdit.href(detail.code)} className="no-print inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
            Edit range
          </Link>
        ) : undefined
      }
    >
      <div className="space-y-4">
        <div className="no-print">
          {ranges.isLoading && <p className="text-sm text-ink-soft">Loading ranges…</p>}
          {ranges.error && <Notice tone="danger">{ranges.error.message}</Notice>}
          {ranges.data && <RangeCards ranges={ranges.data} details={details} selected={params.range} onSelect={choose} />}
        </div>

        {params.range && ranges.data && !summary && <Notice tone="danger">There is no range {params.range}. Choose one of the ranges above.</Notice>}
        {detailError && <Notice tone="danger">{detailError.message}</Notice>}
        {!params.range && ranges.data && <Notice>Choose a range to start.</Notice>}

        {detail && (
          <>
            <Card className="no-print">
              <PlanControls range={detail} params={params} update={update} inverters={inverters} />
            </Card>

            <p className="hidden text-sm print:block">
              {detail.name} ({detail.code}){inverter ? ` with ${inverter.name}` : ''}, printed {formatDate(new Date())}
            </p>

            {!request && <Notice>{params.mode === 'target' ? 'Enter the usable energy the customer needs, in kWh.' : 'Enter a module count per stack.'}</Notice>}
            {local && !local.ok && <PlanErrorNotice error={local.error} />}
            {serverProblem && <Notice tone="danger" title="The server could not confirm this plan">{serverProblem}</Notice>}

            {shown && request && (
              <>
                <PlanActions source={{ request }}>
                  {hasAbility(me, 'plans.create') && (
                    <Button variant="primary" onClick={() => setSaving((s) => !s)} aria-expanded={saving}>
                      Save as draft
                    </Button>
                  )}
                </PlanActions>
                {saving && (
                  <SavePlanForm
                    request={request}
                    forCustomer={hasAbility(me, 'customers.view')}
                    ownCompany={me?.company?.name}
                    onCancel={() => setSaving(false)}
                    onSaved={(saved) => navigate(paths.plan.href(saved.id))}
                  />
                )}
                {confirmed && shown.bom.some((l) => (l.stock?.short ?? 0) > 0) && (
                  <PlanAlternatives
                    request={request}
                    onChoose={(a) => {
                      setSaving(false);
                      update({ range: a.rangeCode, mode: 'modules', modules: String(a.modulesPerStack), stacks: String(a.stacks) });
                    }}
                  />
                )}
                <PlanSheet
                  plan={shown}
                  inverter={inverter}
                  controllerHasDisplay={controller.data?.attributes.hasDisplay === true}
                  bomNote={
                    <span className="no-print text-xs text-ink-soft" aria-live="polite">
                      {shown.confirmed ? 'Stock checked just now.' : server.isFetching || toConfirm !== request ? 'Checking stock…' : ''}
                    </span>
                  }
                />
              </>
            )}
          </>
        )}
      </div>
    </Page>
  );
}
