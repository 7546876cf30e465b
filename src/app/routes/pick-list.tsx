import { useParams } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { Button } from '@/components/ui/button.tsx';
import { usePickList } from '@/features/warehouse/api/get-pick-list.ts';
import { PickListSheet } from '@/features/warehouse/components/pick-list-sheet.tsx';
import { JobPageLinks, JobPageState } from '@/components/ui/job-pages.tsx';

export function PickListRoute() {
  const { id = '' } = useParams();
  const list = usePickList(id);
  if (!list.data) return <JobPageState title="Pick list" error={list.error} loading="Loading the pick list…" />;
  return (
    <Page
      title={`Pick list ${list.data.job.reference}`}
      actions={
        <>
          <Button variant="primary" className="no-print" onClick={() => window.print()}>
            Print
          </Button>
          <JobPageLinks id={id} here="pickList" show={['job', 'pick', 'labels']} />
        </>
      }
    >
      <PickListSheet list={list.data} />
    </Page>
  );
}
