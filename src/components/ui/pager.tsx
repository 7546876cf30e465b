import { Button } from './button.tsx';

/** "N things" and previous/next for a server-paged list. */
export function Pager({ page, pageSize, total, noun, onPage, labels = ['← Previous', 'Next →'] }: { page: number; pageSize: number; total: number; noun: string; onPage: (page: number) => void; labels?: [string, string] }) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  return (
    <nav aria-label="Pages" className="mt-2 flex items-center justify-between text-sm text-ink-soft">
      <span>
        {total} {noun}
      </span>
      <span className="flex items-center gap-2">
        <Button variant="ghost" disabled={page <= 1} onClick={() => onPage(page - 1)}>
          {labels[0]}
        </Button>
        <span className="num">
          {page} / {pages}
        </span>
        <Button variant="ghost" disabled={page >= pages} onClick={() => onPage(page + 1)}>
          {labels[1]}
        </Button>
      </span>
    </nav>
  );
}
