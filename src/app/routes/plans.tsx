import { Link } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useSavedPlans } from '@/features/planner/api/get-saved-plans.ts';
import { SavedPlansTable } from '@/features/planner/components/saved-plans-table.tsx';

export function SavedPlansRoute() {
  const { data: me } = useMe();
  const plans = useSavedPlans();
  const staff = hasAbility(me, 'customers.view');
  return (
    <Page
      title="Saved plans"
      subtitle={staff ? 'Draft stack plans for every customer account.' : `Draft stack plans for ${me?.company?.name ?? 'your company'}.`}
      actions={
        <Link to={paths.planner.href()} className="inline-flex items-center rounded-md border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
          New plan
        </Link>
      }
    >
      {plans.error && <Notice tone="danger">{plans.error.message}</Notice>}
      {plans.isLoading ? <p className="text-sm text-ink-soft">Loading plans…</p> : <SavedPlansTable plans={plans.data ?? []} showCustomer={staff} />}
    </Page>
  );
}
