import type { PlanError } from '@shared/domain/planner.ts';
import { Notice } from '@/components/ui/notice.tsx';

const TITLES: Record<string, string> = {
  modules_out_of_range: 'That module count is outside this range',
  stacks_out_of_range: 'That many stacks is outside this range',
  target_invalid: 'Enter a usable target above 0 kWh',
  target_unreachable: 'This range cannot reach that target',
  no_fit: 'No layout fits this inverter',
  unknown_part: 'A BOM rule names a part that is not in the catalogue',
  missing_input: 'Give a module count or a target',
  conflicting_input: 'Give a module count or a target, not both',
  site_unsuitable: 'This range does not suit the site',
};

const NEXT: Record<string, string> = {
  modules_out_of_range: 'Use the − and + buttons to stay within the range’s limits.',
  stacks_out_of_range: 'Use fewer stacks, or choose a range that allows more.',
  target_unreachable: 'Lower the target, allow more stacks, or choose a larger range.',
  no_fit: 'Choose another inverter or range, or plan without an inverter to see the figures.',
  unknown_part: 'Someone with range editing rights needs to fix the rule.',
  site_unsuitable: 'Change the site details, or choose a range made for this site.',
};

/** A planner refusal, naming the reason and what to try next. */
export function PlanErrorNotice({ error }: { error: Pick<PlanError, 'code' | 'message'> }) {
  return (
    <Notice tone="danger" title={TITLES[error.code] ?? 'The planner could not plan this'}>
      <p data-testid="plan-error" data-code={error.code}>
        {error.message}
      </p>
      {NEXT[error.code] && <p className="mt-0.5 text-xs">{NEXT[error.code]}</p>}
    </Notice>
  );
}
