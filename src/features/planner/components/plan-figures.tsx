import type { ReactNode } from 'react';
import { RESIDENTIAL_FLOOR_KPA } from '@shared/domain/energy.ts';
import { COUNTRY_LABELS, FLOOR_LABELS, LOCATION_LABELS, RESIDENTIAL_FLOOR_POINT_KN, WALL_LABELS } from '@shared/domain/site.ts';
import { StatusTag } from '@/components/ui/notice.tsx';
import { formatNumber } from '@/lib/format.ts';
import type { ShownPlan } from '../lib/plan-view.ts';

export interface InverterWindow {
  name: string;
  batteryMinV: number;
  batteryMaxV: number;
  batteryInputs: number;
}

const plural = (n: number, word: string) => `${formatNumber(n)} ${word}${n === 1 ? '' : 's'}`;

/** A number and its unit, the number in mono so columns of figures line up. */
export function Qty({ value, unit, digits }: { value: number; unit: string; digits?: number }) {
  const text = digits === undefined ? formatNumber(value) : value.toLocaleString('en-AU', { minimumFractionDigits: digits, maximumFractionDigits: digits });
  return (
    <span className="whitespace-nowrap">
      <span className="num">{text}</span> <span className="text-ink-soft">{unit}</span>
    </span>
  );
}

function Figure({ term, children, note, tone }: { term: string; children: ReactNode; note?: ReactNode; tone?: 'caution' }) {
  return (
    <div className={`rounded-md px-2.5 py-1.5 ${tone === 'caution' ? 'border border-amber/50 bg-amber-soft print:border-black print:bg-white' : ''}`}>
      <dt className="text-xs font-semibold text-ink-soft">{term}</dt>
      <dd className="text-[15px] font-medium text-ink">{children}</dd>
      {note && <dd className="mt-0.5 text-xs text-ink-soft">{note}</dd>}
    </div>
  );
}

export function InverterFitLine({ plan, inverter }: { plan: Pick<ShownPlan, 'inverterFit'>; inverter: InverterWindow | null }) {
  const fit = plan.inverterFit;
  if (!fit || !inverter) return <span className="text-sm text-ink-soft">No inverter chosen</span>;
  const window = `${formatNumber(inverter.batteryMinV)}–${formatNumber(inverter.batteryMaxV)} V`;
  return fit.fits ? (
    <span className="flex flex-col items-start gap-1">
      <StatusTag tone="good">fits the {window} window</StatusTag>
      {fit.warnings?.map((w) => (
        <span key={w} className="flex items-start gap-1.5 text-xs font-medium text-[#7a4f12] print:text-black" data-testid="inverter-warning">
          <span aria-hidden="true">!</span>
          {w}
        </span>
      ))}
    </span>
  ) : (
    <span className="flex items-start gap-1.5 text-sm font-medium text-danger">
      <span aria-hidden="true" className="mt-0.5 inline-flex h-4 w-4 shrink-0 items-center justify-center rounded-full border border-current text-[10px] font-bold">
        ✕
      </span>
      <span>
        <span className="sr-only">Does not fit: </span>
        {fit.reason}
      </span>
    </span>
  );
}

/** The plan's figures, each with its unit; the floor load stands out above what a house floor is designed for. */
export function PlanFigures({ plan, inverter }: { plan: ShownPlan; inverter: InverterWindow | null }) {
  // The floor figure matters on a suspended floor; on a slab it is shown but not flagged.
  const suspended = plan.site.floor === 'suspended';
  const heavyFloor = suspended && (plan.floorLoadKpa > RESIDENTIAL_FLOOR_KPA || plan.footLoadKn > RESIDENTIAL_FLOOR_POINT_KN);
  return (
    <div className="space-y-3">
      {/* Screen readers hear the headline figures whenever a change to the plan moves them. */}
      <p className="sr-only" aria-live="polite" aria-atomic="true" data-testid="plan-announcement">
        {`Plan: ${plural(plan.stacks, 'stack')} of ${plural(plan.modulesPerStack, 'module')}, ${formatNumber(plan.usableKwh)} kWh usable, DVC-${plan.dvc}${plan.inverterFit && inverter ? (plan.inverterFit.fits ? ', fits the inverter' : ', does not fit the inverter') : ''}.`}
      </p>
      <dl className="grid grid-cols-2 gap-x-3 gap-y-2 xl:grid-cols-3" aria-label="Plan figures">
        <Figure term="Layout">
          <span className="num">{plural(plan.stacks, 'stack')}</span> × <span className="num">{plural(plan.modulesPerStack, 'module')}</span>
        </Figure>
        <Figure term="Usable energy" note={<>nominal <Qty value={plan.nominalKwh} unit="kWh" /></>}>
          <span data-testid="usable-kwh">
            <Qty value={plan.usableKwh} unit="kWh" />
          </span>
        </Figure>
        <Figure term="Voltage (nominal)" note={<>range <span className="num">{formatNumber(plan.minVoltage)}–{formatNumber(plan.maxVoltage)}</span> V</>}>
          <Qty value={plan.nominalVoltage} unit="V" />
        </Figure>
        <Figure term="DC voltage class" note={plan.connection === 'series' ? 'modules in series' : 'modules in parallel'}>
          <span data-testid="dvc" className="num rounded border-2 border-ink px-1.5 text-sm font-semibold print:border-black">
            DVC-{plan.dvc}
          </span>
        </Figure>
        <Figure term="Capacity">
          <Qty value={plan.capacityAh} unit="Ah" />
        </Figure>
        <Figure term="Height (one stack)">
          <span data-testid="height-mm">
            <Qty value={plan.heightMm} unit="mm" />
          </span>
        </Figure>
        <Figure term="Mass (whole system)">
          <Qty value={plan.massKg} unit="kg" />
        </Figure>
        <Figure term="Footprint">
          <Qty value={plan.footprintM2} unit="m²" />
        </Figure>
        <Figure
          term="Floor load"
          tone={heavyFloor ? 'caution' : undefined}
          note={
            <>
              <Qty value={plan.footLoadKn} unit="kN" digits={2} /> per foot{' '}
              {heavyFloor ? <span className="font-medium text-[#7a4f12] print:text-black">! more than a house floor is designed for</span> : suspended ? '' : '(on a slab)'}
            </>
          }
        >
          <Qty value={plan.floorLoadKpa} unit="kPa" digits={1} />
        </Figure>
        <Figure term="Lifetime throughput (estimate)" note="usable × rated cycles × mean state of health">
          <span data-testid="throughput-estimate">{plan.throughputMwh != null ? <Qty value={plan.throughputMwh} unit="MWh" /> : <span className="text-sm text-ink-soft">not known</span>}</span>
        </Figure>
        <Figure term="Warranted throughput (maker)" note={plan.warrantedThroughputNote ?? 'the maker states none'}>
          <span data-testid="throughput-warranted">{plan.warrantedThroughputMwh != null ? <Qty value={plan.warrantedThroughputMwh} unit="MWh" /> : <span className="text-sm text-ink-soft">none stated</span>}</span>
        </Figure>
        <Figure term="Equivalent full cycles" note={plan.yearsAtOneCyclePerDay != null ? <>≈ <Qty value={plan.yearsAtOneCyclePerDay} unit="years" /> at one a day</> : undefined}>
          {plan.equivalentCycles != null ? <Qty value={plan.equivalentCycles} unit="cycles" /> : <span className="text-sm text-ink-soft">not known</span>}
        </Figure>
        <Figure
          term="Round-trip efficiency"
          note={plan.chargeEfficiencyPct != null && plan.dischargeEfficiencyPct != null ? <>charge <Qty value={plan.chargeEfficiencyPct} unit="%" />, discharge <Qty value={plan.dischargeEfficiencyPct} unit="%" /></> : undefined}
        >
          {plan.roundTripEfficiencyPct != null ? <Qty value={plan.roundTripEfficiencyPct} unit="%" /> : <span className="text-sm text-ink-soft">not given</span>}
        </Figure>
      </dl>
      <div className="rounded-md border border-line px-2.5 py-2" data-testid="inverter-fit">
        <p className="text-xs font-semibold text-ink-soft">Inverter{inverter ? `: ${inverter.name}` : ''}</p>
        <div className="mt-0.5">
          <InverterFitLine plan={plan} inverter={inverter} />
        </div>
      </div>
      <div className="rounded-md border border-line px-2.5 py-2 text-sm" data-testid="plan-site">
        <p className="text-xs font-semibold text-ink-soft">Site</p>
        <p>
          <span className="num">{formatNumber(plan.site.cableRunM)} m</span> cable run · {WALL_LABELS[plan.site.wall]} · {LOCATION_LABELS[plan.site.location]} · {plan.site.sharesHabitableWall ? 'wall shared with a habitable room' : 'wall not shared with a habitable room'} · {FLOOR_LABELS[plan.site.floor]} · {COUNTRY_LABELS[plan.site.country]}
        </p>
        {plan.siteAssumed.length > 0 && <p className="mt-0.5 text-xs text-ink-soft">Assumed, not said: {plan.siteAssumed.join('; ')}.</p>}
      </div>
      {plan.throughputAssumptions.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer font-medium">How the throughput is estimated</summary>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-xs text-ink-soft">
            {plan.throughputAssumptions.map((a) => (
              <li key={a}>{a}</li>
            ))}
          </ul>
        </details>
      )}
      {plan.assumptions.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer font-medium">Figures the planner assumed ({plan.assumptions.length})</summary>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-xs text-ink-soft">
            {plan.assumptions.map((a) => (
              <li key={a}>{a}</li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
