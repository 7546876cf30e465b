// On-screen proofs of a job's labels, the size and order they print in, with each barcode as the
// server renders it and the exact data it carries.
import type { Label } from '@shared/contracts/warehouse.ts';

const KIND: Record<Label['kind'], string> = { pick: 'Pick label', unit: 'Unit label', kit: 'Kit label' };

export function LabelPreview({ labels }: { labels: Label[] }) {
  return (
    <ol className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
      {labels.map((l) => (
        <li key={l.n} className="flex flex-col gap-1 rounded border-2 border-black bg-white p-3 text-black">
          <p className="text-xs font-semibold uppercase tracking-wide">
            {l.n}. {KIND[l.kind]}
          </p>
          {l.lines.map((line, i) => (
            <p key={i} className={i === 0 ? 'num font-bold' : 'text-sm'}>
              {line}
            </p>
          ))}
          <div className="mt-1 flex items-end gap-2">
            <img src={l.png} alt={`Barcode: ${l.text}`} className="h-14 min-w-0 flex-1 object-contain object-left" loading="lazy" />
            {l.qr && <img src={l.qr.png} alt="QR code to the job page" className="h-20 w-20" loading="lazy" />}
          </div>
          <p className="num break-all text-xs">{l.text}</p>
        </li>
      ))}
    </ol>
  );
}
