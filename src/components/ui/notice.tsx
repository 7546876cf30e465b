import type { ReactNode } from 'react';

type Tone = 'info' | 'good' | 'caution' | 'danger';

const tones: Record<Tone, { box: string; icon: string; label: string }> = {
  info: { box: 'border-line bg-card text-ink', icon: 'i', label: 'Note' },
  good: { box: 'border-teal/40 bg-teal-soft text-teal', icon: '✓', label: 'Done' },
  caution: { box: 'border-amber/50 bg-amber-soft text-[#7a4f12]', icon: '!', label: 'Caution' },
  danger: { box: 'border-danger/40 bg-danger-soft text-danger', icon: '✕', label: 'Problem' },
};

/** A message block: tone is carried by an icon and a word as well as colour. */
export function Notice({ tone = 'info', title, children }: { tone?: Tone; title?: string; children?: ReactNode }) {
  const t = tones[tone];
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={`flex gap-3 rounded-md border px-3 py-2 text-sm ${t.box}`}>
      <span aria-hidden="true" className="mt-0.5 inline-flex h-5 w-5 shrink-0 items-center justify-center rounded-full border border-current text-xs font-bold">
        {t.icon}
      </span>
      <div>
        <span className="sr-only">{t.label}: </span>
        {title && <p className="font-semibold">{title}</p>}
        {children}
      </div>
    </div>
  );
}

/** A small status tag: shape + text, never colour alone. `icon` swaps the tone's shape for a more specific one. */
export function StatusTag({ tone, icon, children }: { tone: Tone; icon?: ReactNode; children: ReactNode }) {
  const t = tones[tone];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded border px-1.5 py-0.5 text-xs font-medium ${t.box}`}>
      <span aria-hidden="true">{icon ?? t.icon}</span>
      {children}
    </span>
  );
}
