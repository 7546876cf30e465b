import { useParams } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { Button } from '@/components/ui/button.tsx';
import { download } from '@/lib/api-client.ts';
import { handoverPdfPath, useHandover } from '@/features/warehouse/api/get-handover.ts';
import { HandoverSheet } from '@/features/warehouse/components/handover-sheet.tsx';
import { JobPageLinks, JobPageState } from '@/components/ui/job-pages.tsx';

export function HandoverRoute() {
  const { id = '' } = useParams();
  const handover = useHandover(id);
  if (!handover.data) return <JobPageState title="Handover sheet" error={handover.error} loading="Loading the handover sheet…" />;
  return (
    <Page
      title={`Handover ${handover.data.job.reference}`}
      actions={
        <>
          <Button variant="primary" className="no-print" onClick={() => void download(handoverPdfPath(id))}>
            Download PDF
          </Button>
          <JobPageLinks id={id} here="handover" show={['job']} />
        </>
      }
    >
      <HandoverSheet h={handover.data} />
    </Page>
  );
}
