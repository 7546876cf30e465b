import { useParams } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { usePickList } from '@/features/warehouse/api/get-pick-list.ts';
import { PickScreen } from '@/features/warehouse/components/pick-screen.tsx';
import { JobPageLinks, JobPageState } from '@/components/ui/job-pages.tsx';

export function PickRoute() {
  const { id = '' } = useParams();
  const list = usePickList(id);
  if (!list.data) return <JobPageState title="Pick" error={list.error} loading="Loading the pick…" />;
  const j = list.data.job;
  return (
    <Page title={`Pick ${j.reference}`} subtitle={`${j.company}${j.siteSuburb ? ` · ${j.siteSuburb}` : ''}`} actions={<JobPageLinks id={id} here="pick" show={['job', 'pickList', 'labels']} />}>
      <PickScreen list={list.data} />
    </Page>
  );
}
