import { useEffect, useMemo, useState } from 'react';
import { Link, useParams } from 'react-router';
import type { ColumnDef } from '@tanstack/react-table';
import { IMPORT_FIELDS, IMPORT_FIELD_LABELS, IMPORT_STATUS_LABELS, REQUIRED_IMPORT_FIELDS, type ColumnMapping, type PreviewChange, type PreviewQuery, type PriceList } from '@shared/contracts/purchasing.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { Button } from '@/components/ui/button.tsx';
import { SelectField, TextField } from '@/components/ui/field.tsx';
import { DataTable, PHONE_HIDDEN } from '@/components/ui/data-table.tsx';
import { ProgressBar } from '@/components/ui/progress-bar.tsx';
import { paths } from '@/config/paths.ts';
import { download } from '@/lib/api-client.ts';
import { formatCost, formatDate, formatNumber } from '@/lib/format.ts';
import { PurchasingTabs } from '@/features/purchasing/components/purchasing-tabs.tsx';
import { useMakers } from '@/features/purchasing/api/suppliers.ts';
import { useApplyPriceList, useLinkRows, usePreview, usePriceList, useSetMapping } from '@/features/purchasing/api/price-lists.ts';

type Kind = PreviewQuery['kind'];
const KINDS: { kind: Kind; label: string; count: keyof PriceList['counts'] | 'ok' }[] = [
  { kind: 'all', label: 'All rows', count: 'ok' },
  { kind: 'changed', label: 'Changed', count: 'changed' },
  { kind: 'flagged', label: 'Flagged', count: 'flagged' },
  { kind: 'new', label: 'New', count: 'new' },
  { kind: 'unchanged', label: 'Unchanged', count: 'unchanged' },
  { kind: 'missing', label: 'Missing from file', count: 'missing' },
];

/** The guided import: columns (and sheet) → every row checked, with the diff → link or create parts → apply. */
export function PriceListRoute() {
  const { id = '' } = useParams();
  const setMapping = useSetMapping(id);
  const apply = useApplyPriceList(id);
  const busy = setMapping.isPending || apply.isPending;
  const list = usePriceList(id, busy);
  const pl = list.data;
  const checked = pl && pl.status !== 'uploaded';
  return (
    <Page title={pl ? pl.fileName : 'Price list'} subtitle={pl ? `${pl.supplier.name} · uploaded ${formatDate(pl.createdAt)}${pl.createdBy ? ` by ${pl.createdBy}` : ''}` : undefined} actions={pl && <StatusTag tone={pl.status === 'applied' ? 'good' : 'info'}>{IMPORT_STATUS_LABELS[pl.status]}</StatusTag>}>
      <PurchasingTabs />
      {list.error && <Notice tone="danger">{list.error.message}</Notice>}
      {pl && (
        <div className="space-y-4">
          {pl.sameFileAppliedAt && pl.status !== 'applied' && (
            <Notice tone="caution" title="This very file was applied before">
              On {formatDate(pl.sameFileAppliedAt)}. Applying it again changes nothing that has not changed since.
            </Notice>
          )}
          {pl.status !== 'applied' && <MappingStep key={pl.id + pl.status} pl={pl} onCheck={(mapping, sheet) => setMapping.mutate({ mapping, sheet })} pending={setMapping.isPending} error={setMapping.error?.message} />}
          {setMapping.isPending && <ProgressBar label="Reading and checking rows" done={pl.progress.done} total={pl.progress.total} />}
          {checked && !setMapping.isPending && <PreviewStep pl={pl} />}
          {pl.status === 'ready' && !setMapping.isPending && (
            <Card>
              <h2 className="mb-2 text-sm font-semibold">3. Apply</h2>
              <p className="mb-3 text-sm text-ink-soft">
                Changed and new rows update the supplier’s costs in one step, with their history; part costs and sell prices follow. Rows with problems and new rows not linked to a part are left out.
              </p>
              {apply.isPending && <div className="mb-3"><ProgressBar label="Applying" done={pl.progress.done} total={pl.progress.total} /></div>}
              <Button variant="primary" onClick={() => apply.mutate()} disabled={apply.isPending}>
                {apply.isPending ? 'Applying…' : 'Apply price list'}
              </Button>
              {apply.error && <div className="mt-3"><Notice tone="danger">{apply.error.message}</Notice></div>}
            </Card>
          )}
          {pl.status === 'applied' && (
            <Notice tone="good" title="Applied">
              {formatNumber(Number(pl.counts.applied ?? 0))} supplier parts changed{pl.appliedBy ? ` by ${pl.appliedBy}` : ''} on {pl.appliedAt ? formatDate(pl.appliedAt) : ''}; {formatNumber(Number(pl.counts.pricesMoved ?? 0))} sell prices moved.{' '}
              <Link to={paths.pricing.href()} className="font-semibold underline">See what moved</Link>
            </Notice>
          )}
        </div>
      )}
    </Page>
  );
}

function MappingStep({ pl, onCheck, pending, error }: { pl: PriceList; onCheck: (m: ColumnMapping, sheet?: string) => void; pending: boolean; error?: string }) {
  const [mapping, setMappingState] = useState<ColumnMapping>(pl.mapping);
  const [sheet, setSheet] = useState(pl.sheet ?? '');
  useEffect(() => setMappingState(pl.mapping), [pl.mapping]);
  const missing = REQUIRED_IMPORT_FIELDS.filter((f) => !mapping[f]);
  return (
    <Card>
      <h2 className="mb-1 text-sm font-semibold">1. Columns</h2>
      <p className="mb-3 text-sm text-ink-soft">
        Which column holds what. {pl.status === 'uploaded' ? 'Suggested from the headers (or remembered from this supplier’s last import).' : 'Change them and check again if something is off.'}
      </p>
      {pl.fileKind === 'xlsx' && pl.sheets.length > 1 && (
        <SelectField label="Sheet" className="mb-3 max-w-xs" value={sheet} onChange={(e) => setSheet(e.target.value)} options={pl.sheets.map((s) => ({ value: s, label: s }))} hint="Columns are read again from the chosen sheet when you check." />
      )}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        {IMPORT_FIELDS.map((f) => (
          <SelectField key={f} label={`${IMPORT_FIELD_LABELS[f]}${REQUIRED_IMPORT_FIELDS.includes(f) ? ' (required)' : ''}`} value={mapping[f] ?? ''} onChange={(e) => setMappingState((m) => ({ ...m, [f]: e.target.value || undefined }))} options={pl.columns.map((c) => ({ value: c, label: c }))}>
            <option value="">— not in this file —</option>
          </SelectField>
        ))}
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        <Button variant="primary" onClick={() => onCheck(mapping, sheet && sheet !== pl.sheet ? sheet : undefined)} disabled={pending || missing.length > 0}>
          {pending ? 'Checking…' : pl.status === 'uploaded' ? 'Check every row' : 'Check again'}
        </Button>
        {missing.length > 0 && <span className="text-sm text-danger">Choose {missing.map((f) => IMPORT_FIELD_LABELS[f]).join(' and ')}.</span>}
      </div>
      {error && <div className="mt-3"><Notice tone="danger" title="Cannot check these columns">{error}</Notice></div>}
    </Card>
  );
}

function PreviewStep({ pl }: { pl: PriceList }) {
  const [kind, setKind] = useState<Kind>('changed');
  const [page, setPage] = useState(1);
  const preview = usePreview(pl.id, { kind, page, pageSize: 100 }, true);
  const errors = usePreview(pl.id, { kind: 'error', pageSize: 200 }, true);
  const counts = pl.counts;
  const columns = useChangeColumns(pl);
  const tile = (label: string, n: number | undefined, tone = '') => (
    <div className="rounded-md border border-line bg-card px-3 py-2">
      <div className="text-xs text-ink-soft">{label}</div>
      <div className={`num text-lg font-semibold ${tone}`}>{formatNumber(n ?? 0)}</div>
    </div>
  );
  return (
    <Card>
      <h2 className="mb-3 text-sm font-semibold">2. Check rows and changes</h2>
      <div className="mb-4 grid grid-cols-2 gap-2 sm:grid-cols-4 lg:grid-cols-8">
        {tile('Rows', counts.rows)}
        {tile('With problems', counts.errors, counts.errors ? 'text-danger' : '')}
        {tile('Changed', counts.changed)}
        {tile('Flagged', counts.flagged, counts.flagged ? 'text-[#7a4f12]' : '')}
        {tile('New', counts.new)}
        {tile('Not linked', counts.unlinked)}
        {tile('Unchanged', counts.unchanged)}
        {tile('Missing', counts.missing)}
      </div>
      {(counts.errors ?? 0) > 0 && (
        <div className="mb-4">
          <Notice tone="danger" title={`${formatNumber(counts.errors ?? 0)} rows have problems and will be left out`}>
            <ul tabIndex={0} aria-label="Rows with problems" className="mt-1 max-h-48 list-none space-y-0.5 overflow-y-auto">
              {(errors.data?.errors ?? []).map((e, i) => (
                <li key={i}>
                  Row <span className="num">{e.row}</span>
                  {e.column ? <>, column “{e.column}”</> : null}: {e.message}
                </li>
              ))}
            </ul>
            <button type="button" className="mt-1 font-semibold underline" onClick={() => void download(`/price-lists/${encodeURIComponent(pl.id)}/problems.csv`)}>
              Download the problems as CSV
            </button>
          </Notice>
        </div>
      )}
      <div role="tablist" aria-label="Rows to show" className="mb-2 flex flex-wrap gap-1">
        {KINDS.map((k) => (
          <button key={k.kind} type="button" role="tab" aria-selected={kind === k.kind} onClick={() => { setKind(k.kind); setPage(1); }} className={`rounded-md border px-2 py-1 text-xs font-medium ${kind === k.kind ? 'border-copper bg-copper text-white' : 'border-line bg-card text-ink'}`}>
            {k.label} <span className="num">({formatNumber(Number(counts[k.count] ?? 0))})</span>
          </button>
        ))}
      </div>
      <DataTable label="Price-list changes" data={preview.data?.changes ?? []} columns={columns} getRowId={(c) => `${c.kind}-${c.row ?? c.supplierSku}`} dense empty={preview.isLoading ? 'Loading…' : 'No rows of this kind.'} />
      {(preview.data?.total ?? 0) > 100 && (
        <div className="mt-2 flex items-center gap-2 text-sm">
          <Button onClick={() => setPage((p) => Math.max(1, p - 1))} disabled={page === 1}>Previous</Button>
          <span className="num">Page {page} of {Math.ceil((preview.data?.total ?? 0) / 100)}</span>
          <Button onClick={() => setPage((p) => p + 1)} disabled={page * 100 >= (preview.data?.total ?? 0)}>Next</Button>
        </div>
      )}
    </Card>
  );
}

function useChangeColumns(pl: PriceList) {
  return useMemo<ColumnDef<PreviewChange>[]>(
    () => [
      { id: 'row', header: 'Row', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.row ?? '—'}</span> },
      { id: 'supplierSku', accessorKey: 'supplierSku', header: 'Supplier SKU', cell: (c) => (
        <>
          <span className="num font-semibold break-all">{c.row.original.supplierSku}</span>
          <span className="block text-xs text-ink-soft">{c.row.original.description}</span>
          <span className="block sm:hidden"><Change change={c.row.original} /></span>
        </>
      ) },
      { id: 'ours', header: 'Our part', cell: (c) => <OurPart pl={pl} change={c.row.original} /> },
      { id: 'old', header: 'Cost now', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num">{c.row.original.oldCostCents === null ? '—' : formatCost(c.row.original.oldCostCents)}</span> },
      { id: 'new', header: 'New cost', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <span className="num font-semibold">{c.row.original.newCostCents === null ? '—' : formatCost(c.row.original.newCostCents)}</span> },
      { id: 'pct', header: 'Change', meta: { align: 'right', className: PHONE_HIDDEN }, cell: (c) => <Change change={c.row.original} /> },
    ],
    [pl],
  );
}

function Change({ change }: { change: PreviewChange }) {
  if (change.kind === 'missing') return <StatusTag tone="caution">Not in this file</StatusTag>;
  if (change.kind === 'new') return <StatusTag tone="info" icon="+">New</StatusTag>;
  if (change.changePct === null || change.kind === 'unchanged') return <span className="text-xs text-ink-soft">Unchanged</span>;
  const label = `${change.changePct > 0 ? '+' : ''}${change.changePct.toLocaleString('en-AU')} %`;
  return change.flagged ? <StatusTag tone="caution" icon="⚑">{label}</StatusTag> : <span className="num text-sm">{label}</span>;
}

/** Who the row is for: a matched part, or (new rows) a link to one of ours or a new part. */
function OurPart({ pl, change }: { pl: PriceList; change: PreviewChange }) {
  const link = useLinkRows(pl.id);
  const makers = useMakers();
  const [mode, setMode] = useState<'none' | 'link' | 'create'>('none');
  const [sku, setSku] = useState('');
  const [maker, setMaker] = useState('');
  const [newSku, setNewSku] = useState(change.supplierSku.toUpperCase().replace(/[^A-Z0-9-]+/g, '-'));
  const canEdit = change.kind === 'new' && change.row !== null && pl.status === 'ready';
  if (change.sku && !canEdit) return <span className="num">{change.sku}</span>;
  if (change.createAs) {
    return (
      <span className="text-sm">
        New part <span className="num">{change.createAs.sku}</span>
        {canEdit && <button type="button" className="ml-2 text-xs underline" onClick={() => link.mutate([{ row: change.row!, unlink: true }])}>undo</button>}
      </span>
    );
  }
  if (change.sku) {
    return (
      <span className="text-sm">
        <span className="num">{change.sku}</span> <span className="text-xs text-ink-soft">({change.matchedBy === 'gtin' ? 'same GTIN' : 'linked'})</span>
        {canEdit && <button type="button" className="ml-2 text-xs underline" onClick={() => link.mutate([{ row: change.row!, unlink: true }])}>undo</button>}
      </span>
    );
  }
  if (!canEdit) return <span className="text-xs text-ink-soft">—</span>;
  return (
    <div className="space-y-1">
      {mode === 'none' && (
        <div className="flex flex-wrap gap-1">
          <Button className="px-2 py-0.5 text-xs" onClick={() => setMode('link')}>Link to a part</Button>
          <Button className="px-2 py-0.5 text-xs" onClick={() => setMode('create')}>Create a part</Button>
        </div>
      )}
      {mode === 'link' && (
        <form className="flex flex-wrap items-end gap-1" onSubmit={(e) => { e.preventDefault(); link.mutate([{ row: change.row!, sku }]); }}>
          <TextField label={`Our SKU for row ${change.row}`} mono value={sku} onChange={(e) => setSku(e.target.value)} className="w-40" required />
          <Button type="submit" className="px-2 py-1 text-xs" variant="primary" disabled={link.isPending}>Link</Button>
        </form>
      )}
      {mode === 'create' && (
        <form className="flex flex-wrap items-end gap-1" onSubmit={(e) => { e.preventDefault(); link.mutate([{ row: change.row!, create: { category: 'accessory', maker, sku: newSku } }]); }}>
          <TextField label="New SKU" mono value={newSku} onChange={(e) => setNewSku(e.target.value)} className="w-40" required />
          <SelectField label="Maker" value={maker} onChange={(e) => setMaker(e.target.value)} required className="w-36" options={(makers.data ?? []).map((m) => ({ value: m.code, label: m.name }))}>
            <option value="">Choose…</option>
          </SelectField>
          <Button type="submit" className="px-2 py-1 text-xs" variant="primary" disabled={link.isPending}>Create as accessory</Button>
        </form>
      )}
      {link.error && <p className="text-xs text-danger">{link.error.message}</p>}
    </div>
  );
}
