import { Link, useNavigate, useParams } from 'react-router';
import type { PartDetail } from '@shared/contracts/parts.ts';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { ApiError } from '@/lib/api-client.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { usePart } from '@/features/catalogue/api/get-part.ts';
import { useMakers } from '@/features/catalogue/api/get-makers.ts';
import { useCreatePart, useUpdatePart } from '@/features/catalogue/api/save-part.ts';
import { PartForm } from '@/features/catalogue/components/part-form.tsx';

function CannotEdit({ title, back }: { title: string; back: string }) {
  return (
    <Page title={title}>
      <Notice tone="danger" title="Your role cannot change the catalogue.">
        Purchasing and administrators keep parts up to date; ask them to make the change.{' '}
        <Link to={back} className="underline">
          Go back
        </Link>
        .
      </Notice>
    </Page>
  );
}

export function PartNewRoute() {
  const { data: me } = useMe();
  const makers = useMakers();
  const create = useCreatePart();
  const navigate = useNavigate();
  if (!hasAbility(me, 'catalogue.edit')) return <CannotEdit title="New part" back={paths.catalogue.href()} />;
  return (
    <Page title="New part" subtitle="Common fields first, then the fields of its category. Costs stay hidden from installers.">
      {makers.error && <Notice tone="danger">The list of makers did not load: {makers.error.message} Reload the page to try again.</Notice>}
      {makers.data && (
        <PartForm
          makers={makers.data}
          withCost={hasAbility(me, 'costs.view')}
          saving={create.isPending}
          onSave={(input) => create.mutateAsync(input).then((p) => navigate(paths.part.href(p.sku)))}
          cancelHref={paths.catalogue.href()}
        />
      )}
    </Page>
  );
}

export function PartEditRoute() {
  const { sku = '' } = useParams();
  const { data: me } = useMe();
  const part = usePart(sku);
  const makers = useMakers();

  if (part.error) {
    const missing = part.error instanceof ApiError && part.error.status === 404;
    return (
      <Page title={missing ? 'Part not found' : 'This part could not be loaded'}>
        <Notice tone="danger">
          {missing ? `No part has the SKU ${sku}.` : part.error.message}{' '}
          <Link to={paths.catalogue.href()} className="underline">
            Back to the catalogue
          </Link>
          .
        </Notice>
      </Page>
    );
  }
  if (!part.data || !makers.data)
    return (
      <Page title={`Edit ${sku}`}>
        {makers.error ? <Notice tone="danger">The list of makers did not load: {makers.error.message} Reload the page to try again.</Notice> : <p className="text-ink-soft">Loading…</p>}
      </Page>
    );
  if (!part.data.abilities.edit) return <CannotEdit title={`Edit ${part.data.name}`} back={paths.part.href(sku)} />;
  return <EditForm key={part.data.sku} part={part.data} makers={makers.data} withCost={hasAbility(me, 'costs.view') && part.data.abilities.viewCost} />;
}

function EditForm({ part, makers, withCost }: { part: PartDetail; makers: NonNullable<ReturnType<typeof useMakers>['data']>; withCost: boolean }) {
  const update = useUpdatePart();
  const navigate = useNavigate();
  return (
    <Page
      title={`Edit ${part.name}`}
      subtitle={
        <span>
          <span className="num font-semibold text-ink">{part.sku}</span> · changes apply to every search, plan and price list from now on.
        </span>
      }
    >
      <PartForm
        part={part}
        makers={makers}
        withCost={withCost}
        saving={update.isPending}
        onSave={(input) => update.mutateAsync({ sku: part.sku, input }).then((p) => navigate(paths.part.href(p.sku)))}
        cancelHref={paths.part.href(part.sku)}
      />
    </Page>
  );
}
