import type { StackPlanRequest } from '@shared/contracts/stack-plans.ts';
import type { PlanAlternative } from '@shared/contracts/portal.ts';
import { Button } from '@/components/ui/button.tsx';
import { Card } from '@/components/ui/page.tsx';
import { formatMoney } from '@/lib/format.ts';
import { usePlanAlternatives } from '../api/get-alternatives.ts';

const difference = (cents: number) => (cents === 0 ? 'same price' : cents < 0 ? `${formatMoney(-cents)} less` : `${formatMoney(cents)} more`);

/**
 * When the plan has short lines: the nearest plans that are all in stock now, each with what
 * changes and what it costs, so the installer can choose between waiting and switching.
 */
export function PlanAlternatives({ request, onChoose }: { request: StackPlanRequest | null; onChoose: (a: PlanAlternative) => void }) {
  const { data, isFetching, error } = usePlanAlternatives(request);
  if (!request) return null;
  return (
    <section aria-labelledby="alternatives-heading" className="no-print space-y-2">
      <h2 id="alternatives-heading" className="font-semibold">
        Available now instead
      </h2>
      {error && <p className="text-sm text-danger">{error.message}</p>}
      {isFetching && !data && <p className="text-sm text-ink-soft">Looking for plans that are in stock now…</p>}
      {data && data.alternatives.length === 0 && <p className="text-sm text-ink-soft">No nearby plan is fully in stock today: order this one and the short lines wait on backorder.</p>}
      {data && data.alternatives.length > 0 && (
        <>
          <p className="text-sm text-ink-soft">This plan is short of {data.short.map((s) => `${s.short} × ${s.sku}`).join(', ')}. Waiting is fine; if the site cannot wait, these are in stock now:</p>
          <ul className="grid gap-2 md:grid-cols-2">
            {data.alternatives.map((a) => (
              <li key={`${a.rangeCode}-${a.stacks}-${a.modulesPerStack}`}>
                <Card className="flex h-full flex-col gap-2 py-3">
                  <p className="font-semibold">
                    {a.rangeName}: {a.stacks} × {a.modulesPerStack} modules
                  </p>
                  <ul className="list-disc pl-5 text-sm">
                    {a.changes.map((c) => (
                      <li key={c}>{c}</li>
                    ))}
                  </ul>
                  <p className="text-sm">
                    <span className="num font-semibold">{formatMoney(a.totalCents)}</span> inc GST ({difference(a.differenceCents)})
                  </p>
                  <div className="mt-auto">
                    <Button onClick={() => onChoose(a)}>Use this plan</Button>
                  </div>
                </Card>
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
