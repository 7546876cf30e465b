import { useEffect, type ReactNode } from 'react';

/** Sets the document title and renders the page heading. */
export function Page({ title, actions, children, subtitle }: { title: string; subtitle?: ReactNode; actions?: ReactNode; children: ReactNode }) {
  useEffect(() => {
    document.title = `${title} · Stackyard`;
  }, [title]);
  return (
    <div className="mx-auto max-w-7xl px-4 py-4 sm:px-6 sm:py-5">
      <header className="mb-4 flex flex-wrap items-end justify-between gap-3 border-b border-line pb-3">
        <div>
          <h1 className="text-xl font-semibold tracking-tight">{title}</h1>
          {subtitle && <p className="mt-0.5 text-sm text-ink-soft">{subtitle}</p>}
        </div>
        {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
      </header>
      {children}
    </div>
  );
}

export function Card({ children, className = '' }: { children: ReactNode; className?: string }) {
  return <section className={`rounded-lg border border-line bg-card p-4 ${className}`}>{children}</section>;
}

/** A page whose record is still on its way. */
export function PageLoading({ title, what }: { title: string; what: string }) {
  return (
    <Page title={title}>
      <p className="text-sm text-ink-soft">Loading {what}…</p>
    </Page>
  );
}
