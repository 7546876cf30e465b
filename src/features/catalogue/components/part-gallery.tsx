import { useRef, useState } from 'react';
import type { Media, PartDetail } from '@shared/contracts/parts.ts';
import { CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { formatBytes } from '@/lib/format.ts';
import { useDeletePartMedia } from '../api/part-media.ts';
import { PartOutline } from './part-outline.tsx';

/** Photos (click to enlarge) or, with none, the category's outline drawing. */
export function PartGallery({ part, canEdit }: { part: PartDetail; canEdit: boolean }) {
  const images = part.media.filter((m) => m.kind === 'image');
  const [index, setIndex] = useState(0);
  const dialog = useRef<HTMLDialogElement>(null);
  const remove = useDeletePartMedia(part.sku);
  const shown: Media | undefined = images[Math.min(index, images.length - 1)];

  if (!shown)
    return (
      <figure className="rounded-lg border border-line bg-card p-4">
        <PartOutline category={part.category} className="mx-auto h-44 w-44 text-ink-soft" stroke={2} title="" />
        <figcaption className="mt-2 text-center text-xs text-ink-soft">No photo yet: a generic {CATEGORY_LABELS[part.category].toLowerCase()} drawing.</figcaption>
      </figure>
    );

  return (
    <div className="space-y-2">
      <button
        type="button"
        onClick={() => dialog.current?.showModal()}
        className="block w-full overflow-hidden rounded-lg border border-line bg-white p-2 hover:border-ink-soft"
        aria-label={`Enlarge photo ${images.indexOf(shown) + 1} of ${images.length}`}
      >
        <img src={shown.thumbnailUrl ?? shown.url} alt={`Photo of ${part.name}`} className="mx-auto max-h-60 object-contain" />
      </button>
      {images.length > 1 && (
        <ul className="flex flex-wrap gap-1.5" aria-label="Photos">
          {images.map((m, i) => (
            <li key={m.id}>
              <button
                type="button"
                aria-pressed={m.id === shown.id}
                aria-label={`Show photo ${i + 1} of ${images.length}`}
                onClick={() => setIndex(i)}
                className={`block h-12 w-12 overflow-hidden rounded border bg-white ${m.id === shown.id ? 'border-copper ring-2 ring-copper/40' : 'border-line'}`}
              >
                <img src={m.thumbnailUrl ?? m.url} alt="" className="h-full w-full object-contain" />
              </button>
            </li>
          ))}
        </ul>
      )}
      {canEdit && (
        <Button
          variant="danger"
          className="px-2 py-0.5 text-xs"
          disabled={remove.isPending}
          onClick={() => {
            if (window.confirm(`Remove ${shown.fileName} from this part?`)) remove.mutate(shown.id, { onSuccess: () => setIndex(0) });
          }}
        >
          Remove this photo
        </Button>
      )}
      {remove.error && <Notice tone="danger">{remove.error.message}</Notice>}
      <dialog
        ref={dialog}
        aria-label={`Photo of ${part.name}`}
        className="m-auto max-h-[90vh] max-w-[90vw] rounded-lg border border-line bg-card p-3 backdrop:bg-ink/70"
        onClick={(e) => {
          if (e.target === e.currentTarget) dialog.current?.close();
        }}
      >
        <img src={shown.url} alt={`Photo of ${part.name}, full size`} className="max-h-[78vh] max-w-full object-contain" />
        <div className="mt-2 flex items-center justify-between gap-4 text-xs text-ink-soft">
          <span className="num">
            {shown.fileName} · {formatBytes(shown.bytes)}
          </span>
          <Button onClick={() => dialog.current?.close()}>Close</Button>
        </div>
      </dialog>
    </div>
  );
}

/** Datasheet PDFs, opened in a new tab. */
export function PartDocuments({ part, canEdit }: { part: PartDetail; canEdit: boolean }) {
  const sheets = part.media.filter((m) => m.kind === 'datasheet');
  const remove = useDeletePartMedia(part.sku);
  if (sheets.length === 0) return null;
  return (
    <section aria-labelledby="datasheets" className="rounded-lg border border-line bg-card p-3">
      <h2 id="datasheets" className="mb-1.5 text-sm font-semibold">
        Datasheets
      </h2>
      <ul className="space-y-1 text-sm">
        {sheets.map((m) => (
          <li key={m.id} className="flex items-baseline gap-2">
            <span aria-hidden="true" className="rounded border border-ink-soft/50 px-1 text-[10px] font-semibold leading-4 text-ink-soft">
              PDF
            </span>
            <a href={m.url} target="_blank" rel="noopener" className="min-w-0 flex-1 truncate text-copper underline hover:text-copper-dark">
              {m.fileName}
            </a>
            <span className="num shrink-0 text-xs text-ink-soft">{formatBytes(m.bytes)}</span>
            {canEdit && (
              <button
                type="button"
                className="shrink-0 text-xs text-danger underline"
                disabled={remove.isPending}
                onClick={() => window.confirm(`Remove ${m.fileName} from this part?`) && remove.mutate(m.id)}
              >
                Remove<span className="sr-only"> {m.fileName}</span>
              </button>
            )}
          </li>
        ))}
      </ul>
      {remove.error && (
        <div className="mt-2">
          <Notice tone="danger">{remove.error.message}</Notice>
        </div>
      )}
    </section>
  );
}
