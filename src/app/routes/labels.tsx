import { useParams } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { download } from '@/lib/api-client.ts';
import { labelsPdfPath, useLabels } from '@/features/warehouse/api/get-labels.ts';
import { LabelPreview } from '@/features/warehouse/components/label-preview.tsx';
import { JobPageLinks, JobPageState } from '@/components/ui/job-pages.tsx';

export function LabelsRoute() {
  const { id = '' } = useParams();
  const labels = useLabels(id);
  if (!labels.data)
    return (
      <JobPageState title="Labels" error={labels.error} loading="Loading the labels…">
        <p className="mt-3 flex flex-wrap gap-2">
          <JobPageLinks id={id} here="labels" show={['job']} />
        </p>
      </JobPageState>
    );
  const count = (k: string) => labels.data.filter((l) => l.kind === k).length;
  return (
    <Page
      title="Labels"
      subtitle={`${labels.data.length} labels: ${count('pick')} pick, ${count('unit')} unit, ${count('kit')} kit`}
      actions={
        <>
          <Button variant="primary" onClick={() => void download(labelsPdfPath(id, 'a4'))}>
            A4 sheets (PDF)
          </Button>
          <Button onClick={() => void download(labelsPdfPath(id, 'thermal'))}>Thermal 100 × 150 (PDF)</Button>
          <JobPageLinks id={id} here="labels" show={['job', 'pick']} />
        </>
      }
    >
      <div className="space-y-3">
        <Notice>A4 sheets take 3 × 7 labels of 63.5 × 38.1 mm; print at 100 % (no “fit to page”) so the barcodes keep their size.</Notice>
        <LabelPreview labels={labels.data} />
      </div>
    </Page>
  );
}
