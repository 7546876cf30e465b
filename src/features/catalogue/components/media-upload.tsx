import { useId, useRef, useState, type DragEvent } from 'react';
import { ApiError } from '@/lib/api-client.ts';
import { Notice } from '@/components/ui/notice.tsx';
import { formatBytes } from '@/lib/format.ts';
import { useUploadPartMedia } from '../api/part-media.ts';

const MB = 1024 * 1024;
const IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/webp'];
const IMAGE_MAX = 5 * MB;
const PDF_MAX = 20 * MB;

/** Obvious problems caught before the upload; the server still checks the content itself. */
function precheck(f: File): string | null {
  const isPdf = f.type === 'application/pdf' || /\.pdf$/i.test(f.name);
  const isImage = IMAGE_TYPES.includes(f.type) || /\.(jpe?g|png|webp)$/i.test(f.name);
  if (f.size === 0) return `${f.name} is empty. Choose the file again.`;
  if (!isPdf && !isImage) return `${f.name} is not a photo or a PDF. Upload JPEG, PNG or WebP photos, or PDF datasheets.`;
  if (isImage && f.size > IMAGE_MAX) return `${f.name} is ${formatBytes(f.size)}; photos can be at most 5 MB. Save it smaller and try again.`;
  if (isPdf && f.size > PDF_MAX) return `${f.name} is ${formatBytes(f.size)}; datasheets can be at most 20 MB. Ask the maker for a smaller PDF.`;
  return null;
}

function explain(f: File, e: unknown): string {
  if (e instanceof ApiError) {
    if (e.status === 413) return `${f.name} is too large: photos up to 5 MB, datasheets up to 20 MB.`;
    return `${f.name}: ${e.message}`;
  }
  return `${f.name} did not upload. Check your connection and try again.`;
}

type Message = { tone: 'good' | 'danger'; text: string };

/** Add photos and datasheets by choosing or dropping files; each file gets its own result line. */
export function MediaUpload({ sku }: { sku: string }) {
  const upload = useUploadPartMedia(sku);
  const [messages, setMessages] = useState<Message[]>([]);
  const [over, setOver] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const id = useId();

  const send = async (files: File[]) => {
    const out: Message[] = [];
    for (const f of files) {
      const problem = precheck(f);
      if (problem) {
        out.push({ tone: 'danger', text: problem });
        continue;
      }
      try {
        const m = await upload.mutateAsync(f);
        out.push({ tone: 'good', text: `${m.fileName} added as ${m.kind === 'image' ? 'a photo' : 'a datasheet'}.` });
      } catch (e) {
        out.push({ tone: 'danger', text: explain(f, e) });
      }
      setMessages([...out]);
    }
    setMessages(out);
    if (input.current) input.current.value = '';
  };

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    void send(Array.from(e.dataTransfer.files));
  };

  return (
    <div>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        className={`rounded-lg border-2 border-dashed p-3 text-sm ${over ? 'border-copper bg-amber-soft' : 'border-line bg-card'}`}
      >
        <label htmlFor={id} className="block font-semibold">
          Add photos or datasheets
        </label>
        <p id={`${id}-hint`} className="mb-2 text-xs text-ink-soft">
          Drop files here or choose them. JPEG, PNG or WebP photos up to 5 MB; PDF datasheets up to 20 MB.
        </p>
        <input
          ref={input}
          id={id}
          type="file"
          multiple
          accept="image/jpeg,image/png,image/webp,application/pdf,.pdf"
          aria-describedby={`${id}-hint`}
          disabled={upload.isPending}
          onChange={(e) => void send(Array.from(e.target.files ?? []))}
          className="block w-full text-xs file:mr-2 file:rounded-md file:border file:border-line file:bg-paper file:px-2 file:py-1 file:text-xs file:font-medium"
        />
        {upload.isPending && <p className="mt-1 text-xs text-ink-soft">Uploading…</p>}
      </div>
      {messages.length > 0 && (
        <div className="mt-2 space-y-1">
          {messages.map((m, i) => (
            <Notice key={i} tone={m.tone}>
              {m.text}
            </Notice>
          ))}
        </div>
      )}
    </div>
  );
}
