import { useEffect, useRef, type ReactNode } from 'react';
import { Card } from '@/components/ui/page.tsx';
import { bracketsPerStack, type ShownPlan } from '../lib/plan-view.ts';
import { StackDrawing } from './stack-drawing.tsx';
import { PlanFigures, type InverterWindow } from './plan-figures.tsx';
import { PlanBomTable } from './plan-bom-table.tsx';
import { PlanCautions } from './plan-cautions.tsx';

interface PlanSheetProps {
  plan: ShownPlan;
  inverter: InverterWindow | null;
  controllerHasDisplay?: boolean;
  /** Shown above the BOM, e.g. "checking stock…". */
  bomNote?: ReactNode;
}

/** Drawing beside the figures, then the BOM and the cautions: the same on screen, in the saved plan and on paper. */
export function PlanSheet({ plan, inverter, controllerHasDisplay, bomNote }: PlanSheetProps) {
  const sheet = useRef<HTMLDivElement>(null);
  useEffect(() => {
    // Paper cannot click "show more": open every folded section before printing.
    const open = () => sheet.current?.querySelectorAll('details').forEach((d) => (d.open = true));
    window.addEventListener('beforeprint', open);
    return () => window.removeEventListener('beforeprint', open);
  }, []);

  return (
    <div ref={sheet} className="print-ink space-y-4">
      <div className="grid gap-4 lg:grid-cols-[minmax(260px,360px)_1fr] print:grid-cols-[300px_1fr]">
        <Card className="flex flex-col items-center print:break-inside-avoid">
          <h2 className="sr-only">Drawing</h2>
          <StackDrawing
            units={plan.units}
            heightMm={plan.heightMm}
            unitWidthMm={plan.unitWidthMm}
            stacks={plan.stacks}
            dvc={plan.dvc}
            bracketsPerStack={bracketsPerStack(plan)}
            controllerHasDisplay={controllerHasDisplay}
          />
        </Card>
        <Card className="print:break-inside-avoid">
          <h2 className="mb-2 text-base font-semibold">Figures</h2>
          <PlanFigures plan={plan} inverter={inverter} />
        </Card>
      </div>
      <section aria-labelledby="bom-heading" className="space-y-2">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id="bom-heading" className="text-base font-semibold">
            Bill of materials
          </h2>
          {bomNote}
        </div>
        <PlanBomTable plan={plan} />
      </section>
      <PlanCautions cautions={plan.cautions} />
    </div>
  );
}
