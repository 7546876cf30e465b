// What the job's warehouse pages share: the loading and error states, and the links between them.
import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';

const link = 'no-print inline-flex items-center rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft';

/** Links from one of a job's warehouse pages to the others (and the job), except the one shown. */
export function JobPageLinks({ id, here, show = ['job', 'pick', 'pickList', 'labels', 'handover'] }: { id: string; here: string; show?: string[] }) {
  const all = [
    { key: 'job', label: 'Job', href: paths.job.href(id) },
    { key: 'pick', label: 'Pick screen', href: paths.pick.href(id) },
    { key: 'pickList', label: 'Pick list', href: paths.pickList.href(id) },
    { key: 'labels', label: 'Labels', href: paths.labels.href(id) },
    { key: 'handover', label: 'Handover sheet', href: paths.handover.href(id) },
  ];
  return (
    <>
      {all
        .filter((l) => l.key !== here && show.includes(l.key))
        .map((l) => (
          <Link key={l.key} to={l.href} className={link}>
            {l.label}
          </Link>
        ))}
    </>
  );
}

/** The page while its data loads or when it cannot be had. */
export function JobPageState({ title, error, loading, children }: { title: string; error: Error | null; loading: string; children?: ReactNode }) {
  return (
    <Page title={title}>
      {error ? <Notice tone="danger">{error.message}</Notice> : <p className="text-sm text-ink-soft">{loading}</p>}
      {children}
    </Page>
  );
}
