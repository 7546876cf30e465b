import { useEffect, useState } from 'react';
import { CATEGORY_LABELS, type CategoryCode } from '@shared/contracts/part-attributes.ts';
import { gstOnExclusiveCents } from '@shared/domain/money.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { SelectField } from '@/components/ui/field.tsx';
import { formatDate, formatMoney } from '@/lib/format.ts';
import { download } from '@/lib/api-client.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { useRecomputes, useRules, useSaveRules, useSetCustomerTier, useTiers, type PricingRule } from '@/features/purchasing/api/pricing.ts';

/** Sell pricing: markup rules per category, customer tiers, and what moved at each recompute. */
export function PricingRoute() {
  return (
    <Page title="Sell pricing" subtitle="Sell price = cost × (1 + markup), or the supplier’s recommended price; less the customer’s tier. Prices are ex GST; GST is added on invoices.">
      <PurchasingTabs />
      <div className="grid gap-4 lg:grid-cols-2">
        <RulesCard />
        <TiersCard />
      </div>
      <MovedCard />
    </Page>
  );
}

function RulesCard() {
  const rules = useRules();
  const save = useSaveRules();
  const [draft, setDraft] = useState<PricingRule[]>([]);
  useEffect(() => setDraft(rules.data ?? []), [rules.data]);
  const edit = (i: number, patch: Partial<PricingRule>) => setDraft((d) => d.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  return (
    <Card>
      <h2 className="mb-2 text-sm font-semibold">Rules per category</h2>
      <table className="w-full text-sm">
        <thead>
          <tr className="text-left text-xs text-ink-soft">
            <th className="py-1 font-semibold">Category</th>
            <th className="py-1 font-semibold">Basis</th>
            <th className="py-1 text-right font-semibold">Markup %</th>
          </tr>
        </thead>
        <tbody>
          {draft.map((r, i) => (
            <tr key={r.category} className="border-t border-line">
              <td className="py-1 pr-2">{CATEGORY_LABELS[r.category as CategoryCode] ?? r.category}</td>
              <td className="py-1 pr-2">
                <select aria-label={`Basis for ${r.category}`} value={r.basis} onChange={(e) => edit(i, { basis: e.target.value as PricingRule['basis'] })} className="w-full rounded border border-line bg-card px-1 py-0.5">
                  <option value="markup">Cost + markup</option>
                  <option value="supplier-list">Supplier’s price</option>
                </select>
              </td>
              <td className="py-1 text-right">
                <input aria-label={`Markup for ${r.category}`} inputMode="decimal" value={String(r.markupPct)} onChange={(e) => edit(i, { markupPct: Number(e.target.value) })} className="num w-20 rounded border border-line bg-card px-1 py-0.5 text-right" disabled={r.basis !== 'markup'} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        <Button variant="primary" onClick={() => save.mutate(draft)} disabled={save.isPending || draft.length === 0}>Save and recompute</Button>
        {save.data && <span className="text-sm text-teal">{save.data.moved} sell prices moved.</span>}
        {save.error && <span className="text-sm text-danger">{save.error.message}</span>}
      </div>
    </Card>
  );
}

function TiersCard() {
  const tiers = useTiers();
  const setTier = useSetCustomerTier();
  return (
    <Card>
      <h2 className="mb-2 text-sm font-semibold">Customer tiers</h2>
      <ul className="mb-3 space-y-0.5 text-sm">
        {(tiers.data?.data ?? []).map((t) => (
          <li key={t.id}>
            <span className="font-semibold">{t.name}</span> <span className="num">({t.code})</span>: <span className="num">{t.discountPct} %</span> off · {t.companies.length} customers
          </li>
        ))}
      </ul>
      <div className="space-y-2">
        {(tiers.data?.customers ?? []).map((c) => (
          <SelectField key={c.id} label={c.name} value={c.tierId ?? ''} onChange={(e) => setTier.mutate({ companyId: c.id, tierId: e.target.value || null })} options={(tiers.data?.data ?? []).map((t) => ({ value: t.id, label: `${t.name} (${t.discountPct} %)` }))}>
            <option value="">No tier (account discount)</option>
          </SelectField>
        ))}
      </div>
      {setTier.error && <p className="mt-2 text-sm text-danger">{setTier.error.message}</p>}
    </Card>
  );
}

function MovedCard() {
  const runs = useRecomputes();
  return (
    <section className="mt-6">
      <h2 className="mb-2 text-sm font-semibold">What moved</h2>
      {runs.error && <Notice tone="danger">{runs.error.message}</Notice>}
      {(runs.data ?? []).length === 0 && <p className="text-sm text-ink-soft">No sell prices have been recomputed yet.</p>}
      <div className="space-y-3">
        {(runs.data ?? []).map((r) => (
          <Card key={r.id}>
            <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
              <p className="text-sm"><span className="font-semibold">{r.reason}</span> · {formatDate(r.at)}{r.by ? ` · ${r.by}` : ''} · {r.moved} moved</p>
              {r.moved > 0 && <Button className="px-2 py-0.5 text-xs" onClick={() => void download(`/pricing/recomputes/${encodeURIComponent(r.id)}/moves.csv`)}>CSV</Button>}
            </div>
            {r.moves.length > 0 && (
              <div tabIndex={0} role="region" aria-label={`Prices moved: ${r.reason}`} className="max-h-64 overflow-y-auto">
                <table className="w-full text-sm">
                  <thead>
                    <tr className="text-left text-xs text-ink-soft">
                      <th className="py-1 font-semibold">SKU</th>
                      <th className="py-1 text-right font-semibold">Was</th>
                      <th className="py-1 text-right font-semibold">Now ex GST</th>
                      <th className="hidden py-1 text-right font-semibold sm:table-cell">GST</th>
                      <th className="py-1 text-right font-semibold">Change</th>
                    </tr>
                  </thead>
                  <tbody>
                    {r.moves.slice(0, 200).map((m) => (
                      <tr key={m.sku} className="border-t border-line">
                        <td className="num py-0.5 pr-2 break-all">{m.sku}</td>
                        <td className="num py-0.5 text-right">{m.oldCents === null ? '—' : formatMoney(m.oldCents)}</td>
                        <td className="num py-0.5 text-right font-semibold">{formatMoney(m.newCents)}</td>
                        <td className="num hidden py-0.5 text-right sm:table-cell">{formatMoney(gstOnExclusiveCents(m.newCents))}</td>
                        <td className="num py-0.5 text-right">{m.changePct === null ? 'new' : `${m.changePct > 0 ? '+' : ''}${m.changePct} %`}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
          </Card>
        ))}
      </div>
    </section>
  );
}
