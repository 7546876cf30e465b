import { Link, useParams } from 'react-router';
import type { PartDetail } from '@shared/contracts/parts.ts';
import { CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';
import { Page, Card, PageLoading } from '@/components/ui/page.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { ApiError } from '@/lib/api-client.ts';
import { formatCost, formatMoney, withUnit } from '@/lib/format.ts';
import { usePart } from '@/features/catalogue/api/get-part.ts';
import { useArchivePart, useRestorePart } from '@/features/catalogue/api/archive-part.ts';
import { LifecycleTag } from '@/features/catalogue/components/part-status.tsx';
import { PartDocuments, PartGallery } from '@/features/catalogue/components/part-gallery.tsx';
import { MediaUpload } from '@/features/catalogue/components/media-upload.tsx';
import { PartSpecs, formatDimensions, packText } from '@/features/catalogue/components/part-specs.tsx';
import { DangerousGoodsNote } from '@/features/catalogue/components/dangerous-goods-note.tsx';
import { StockBars } from '@/features/catalogue/components/stock-bars.tsx';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { PartStockSettingsPanel } from '@/features/stock/components/part-stock-settings.tsx';

const linkClass = 'font-medium text-copper underline hover:text-copper-dark';

export function PartRoute() {
  const { sku = '' } = useParams();
  const { data: part, error, isLoading } = usePart(sku);

  if (isLoading) return <PageLoading title={sku} what="the part" />;
  if (error || !part) {
    const missing = error instanceof ApiError && error.status === 404;
    return (
      <Page title={missing ? 'Part not found' : 'This part could not be shown'}>
        <Notice tone="danger">
          {missing ? (
            <>
              No part has the SKU <span className="num font-semibold">{sku}</span>. Check the code, or{' '}
            </>
          ) : (
            <>{error?.message} Try again in a moment, or </>
          )}
          <Link to={paths.catalogue.href(new URLSearchParams({ q: sku }).toString())} className="underline">
            search the catalogue
          </Link>
          .
        </Notice>
      </Page>
    );
  }
  return <PartView part={part} />;
}

function PartView({ part }: { part: PartDetail }) {
  const { data: me } = useMe();
  const archive = useArchivePart();
  const restore = useRestorePart();
  const canEdit = part.abilities.edit;
  const dims = formatDimensions(part);
  const failed = archive.error ?? restore.error;

  return (
    <Page
      title={part.name}
      subtitle={
        <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
          <span className="num font-semibold text-ink" data-testid="part-sku">
            {part.sku}
          </span>
          <span aria-hidden="true">·</span>
          <span>{part.makerName}</span>
          <span aria-hidden="true">·</span>
          <span>{CATEGORY_LABELS[part.category]}</span>
          <LifecycleTag lifecycle={part.lifecycle} showActive />
          {part.archived && (
            <StatusTag tone="info" icon="▤">
              Archived
            </StatusTag>
          )}
        </span>
      }
      actions={
        canEdit && (
          <>
            <Link to={paths.partEdit.href(part.sku)} className="inline-flex items-center gap-2 rounded-md border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
              Edit
            </Link>
            {part.archived ? (
              <Button disabled={restore.isPending} onClick={() => restore.mutate(part.sku)}>
                {restore.isPending ? 'Restoring…' : 'Restore'}
              </Button>
            ) : (
              <Button variant="danger" disabled={archive.isPending} onClick={() => archive.mutate(part.sku)}>
                {archive.isPending ? 'Archiving…' : 'Archive'}
              </Button>
            )}
          </>
        )
      }
    >
      <p className="-mt-2 mb-3 text-sm">
        <Link to={paths.catalogue.href()} className="text-ink-soft hover:text-ink hover:underline">
          ← Catalogue
        </Link>
      </p>

      <div className="mb-4 space-y-2">
        {failed && <Notice tone="danger">{failed.message}</Notice>}
        {part.archived && (
          <Notice tone="caution" title="Archived">
            This part no longer shows in searches or new plans. {canEdit ? 'Restore it to sell it again.' : 'Ask purchasing if you need it back.'}
          </Notice>
        )}
        {part.supersededBy && (
          <Notice tone="caution" title="Superseded">
            Replaced by{' '}
            <Link to={paths.part.href(part.supersededBy.sku)} className={linkClass}>
              <span className="num">{part.supersededBy.sku}</span> {part.supersededBy.name}
            </Link>
            . Offer that part instead; sell this one only to match existing installations.
          </Notice>
        )}
        {part.lifecycle === 'discontinued' && (
          <Notice tone="danger" title="Discontinued">
            The maker no longer makes this part. Sell what is in stock; nothing more can be ordered.
          </Notice>
        )}
      </div>

      <div className="grid gap-4 lg:grid-cols-[17rem_minmax(0,1fr)]">
        <div className="space-y-3">
          <PartGallery part={part} canEdit={canEdit} />
          <PartDocuments part={part} canEdit={canEdit} />
          {canEdit && <MediaUpload sku={part.sku} />}
        </div>

        <div className="min-w-0 space-y-4">
          {part.description && <p className="max-w-3xl">{part.description}</p>}

          <dl className="flex flex-wrap gap-x-6 gap-y-2 rounded-lg border border-line bg-card px-4 py-2.5 text-sm">
            <Fact label="List price (ex GST)" value={part.listPriceCents === null ? '—' : formatMoney(part.listPriceCents)} />
            {part.abilities.viewCost && <Fact label="Cost (ex GST)" value={part.costCents === null || part.costCents === undefined ? '—' : formatCost(part.costCents)} />}
            <Fact label="GTIN" value={part.gtin ?? '—'} />
            <Fact label="Sold as" value={packText(part)} plain />
            <Fact label="Mass" value={withUnit(part.massKg, 'kg')} />
            {dims && <Fact label="Size (W × H × D)" value={dims} />}
            {part.ipRating && <Fact label="IP rating" value={part.ipRating} />}
          </dl>

          {part.supersedes.length > 0 && (
            <p className="text-sm">
              <span className="text-ink-soft">Replaces </span>
              {part.supersedes.map((s, i) => (
                <span key={s.sku}>
                  {i > 0 && ', '}
                  <Link to={paths.part.href(s.sku)} className={linkClass}>
                    <span className="num">{s.sku}</span>
                  </Link>{' '}
                  {s.name}
                </span>
              ))}
            </p>
          )}

          <DangerousGoodsNote part={part} />

          <Card className="p-3">
            <h2 className="mb-2 text-sm font-semibold">Stock by warehouse</h2>
            <StockBars stock={part.stock} />
          </Card>

          {hasAbility(me, 'stock.view') && (
            <Card className="p-3">
              <h2 className="mb-2 text-sm font-semibold">Stock settings</h2>
              <PartStockSettingsPanel sku={part.sku} canSetLimits={hasAbility(me, 'stock.limits')} canSetBins={hasAbility(me, 'warehouses.manage')} />
            </Card>
          )}
        </div>
      </div>

      <div className="mt-4">
        <PartSpecs part={part} />
      </div>
    </Page>
  );
}

function Fact({ label, value, plain = false }: { label: string; value: string; plain?: boolean }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{label}</dt>
      <dd className={`${plain ? '' : 'num'} font-semibold`}>{value}</dd>
    </div>
  );
}
