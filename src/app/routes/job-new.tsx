import { useNavigate, useSearchParams } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { paths } from '@/config/paths.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { useSavedPlans } from '@/features/planner/api/get-saved-plans.ts';
import { useCustomers } from '@/features/planner/api/get-customers.ts';
import { useWarehouses } from '@/features/stock/api/get-warehouses.ts';
import { NewJobForm } from '@/features/jobs/components/new-job-form.tsx';

/** A new job; `?plan=<id>` starts from that saved plan ("order this plan"). */
export function NewJobRoute() {
  const { data: me } = useMe();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const staff = hasAbility(me, 'customers.view');
  const plans = useSavedPlans();
  const { data: customers = [] } = useCustomers(staff);
  const { data: warehouses = [] } = useWarehouses(hasAbility(me, 'stock.view'));
  return (
    <Page title="New job" subtitle={staff ? 'For any customer account: from their saved plans and lines by SKU.' : `For ${me?.company?.name ?? 'your company'}: from your saved plans and lines by SKU.`}>
      {plans.isLoading ? (
        <p className="text-sm text-ink-soft">Loading saved plans…</p>
      ) : (
        <NewJobForm plans={plans.data ?? []} customers={staff ? customers : null} warehouses={hasAbility(me, 'stock.view') ? warehouses : null} initialPlanId={params.get('plan') ?? undefined} onCreated={(job) => navigate(paths.job.href(job.id))} />
      )}
    </Page>
  );
}
