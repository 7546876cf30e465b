import { useState, type ReactNode } from 'react';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { downloadPlanFile, type PlanFile } from '../api/download-plan.ts';

type Source = Parameters<typeof downloadPlanFile>[0];

/** Files and paper for a plan: the BOM as CSV, the plan as PDF, or the page itself printed. */
export function PlanActions({ source, disabled, children }: { source: Source | null; disabled?: boolean; children?: ReactNode }) {
  const [busy, setBusy] = useState<PlanFile | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const get = async (file: PlanFile) => {
    if (!source) return;
    setBusy(file);
    setProblem(null);
    try {
      await downloadPlanFile(source, file);
    } catch (e) {
      setProblem(e instanceof Error ? e.message : 'The file could not be made. Try again.');
    } finally {
      setBusy(null);
    }
  };
  const off = disabled || !source;
  return (
    <div className="no-print space-y-2">
      <div className="flex flex-wrap gap-2">
        <Button onClick={() => get('bom.csv')} disabled={off || busy !== null}>
          <span aria-hidden="true">↓</span> {busy === 'bom.csv' ? 'Preparing…' : 'Download BOM (CSV)'}
        </Button>
        <Button onClick={() => get('plan.pdf')} disabled={off || busy !== null}>
          <span aria-hidden="true">↓</span> {busy === 'plan.pdf' ? 'Preparing…' : 'Download PDF'}
        </Button>
        <Button onClick={() => window.print()} disabled={off}>
          Print
        </Button>
        {children}
      </div>
      {problem && <Notice tone="danger">{problem}</Notice>}
    </div>
  );
}
