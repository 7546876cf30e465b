// The pick screen: one task at a time in big type. Focus stays in the scan field so a
// keyboard-wedge scanner (fast typing ending in Enter) always lands there; every answer is shown
// in colour, words and a tone; scans made offline wait on the device and are sent in order.
import { useCallback, useEffect, useRef, useState, type FormEvent } from 'react';
import { JOB_STATUS_LABELS } from '@shared/contracts/jobs.ts';
import type { PickList, PickScanResult } from '@shared/contracts/warehouse.ts';
import { Button } from '@/components/ui/button.tsx';
import { Notice, StatusTag } from '@/components/ui/notice.tsx';
import { useScanQueue, type ScanOutcome } from '../hooks/use-scan-queue.ts';
import { useScanSound } from '../hooks/use-scan-sound.ts';
import { useCompletePick, usePickPause } from '../api/pick-action.ts';
import { CameraScanner } from './camera-scanner.tsx';
import { PickProgressBar } from './pick-progress.tsx';

type Feedback = { ok: boolean; title: string; message: string; expected?: string } | null;

function feedbackFrom(o: ScanOutcome): NonNullable<Feedback> {
  if (o.kind === 'error') return { ok: false, title: `Not taken: ${o.code}`, message: o.message };
  const r: PickScanResult = o.result;
  return { ok: r.accepted, title: r.accepted ? (r.replay ? 'Already counted' : 'Scan taken') : `Refused: ${o.code}`, message: r.message, expected: r.expected };
}

export function PickScreen({ list }: { list: PickList }) {
  const jobId = list.job.id;
  const input = useRef<HTMLInputElement>(null);
  const [code, setCode] = useState('');
  const [qty, setQty] = useState('');
  const [camera, setCamera] = useState(false);
  const [feedback, setFeedback] = useState<Feedback>(null);
  const beep = useScanSound();
  const onOutcome = useCallback(
    (o: ScanOutcome) => {
      const f = feedbackFrom(o);
      setFeedback(f);
      beep(f.ok);
    },
    [beep],
  );
  const { submit, waiting, offline } = useScanQueue(jobId, onOutcome);
  const pause = usePickPause(jobId);
  const complete = useCompletePick(jobId);

  // The scan field keeps the focus: a scanner's keystrokes must never land anywhere else.
  const refocus = useCallback(() => {
    window.setTimeout(() => {
      const active = document.activeElement;
      if (!active || active === document.body) input.current?.focus();
    }, 0);
  }, []);
  useEffect(() => {
    input.current?.focus();
  }, []);

  const onScan = (e: FormEvent) => {
    e.preventDefault();
    const text = code.trim();
    if (!text) return;
    const n = qty ? Number(qty) : undefined;
    submit(text, n && Number.isInteger(n) && n > 0 ? n : undefined);
    setCode('');
    setQty('');
    input.current?.focus();
  };

  const done = list.progress.units > 0 && list.progress.picked === list.progress.units;
  const canScan = list.abilities.scan;
  const lines = list.groups.flatMap((g) => g.lines.map((l) => ({ ...l, warehouse: g.warehouse })));
  const next = list.current ? lines.find((l) => l.lineId === list.current!.lineId) : lines.find((l) => l.picked < l.qty);

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-2 text-base">
        <StatusTag tone={list.state === 'paused' ? 'caution' : list.state === 'done' ? 'good' : 'info'}>{list.state === 'paused' ? 'Paused' : JOB_STATUS_LABELS[list.job.status]}</StatusTag>
        {list.picker && <span className="text-ink-soft">Picker: {list.picker}</span>}
      </div>
      <PickProgressBar progress={list.progress} large />

      {list.state === 'paused' && (
        <Notice tone="caution" title={`Paused${list.picker ? ` by ${list.picker}` : ''}`}>
          <p>Anyone in the warehouse can resume this pick and carry on from here.</p>
        </Notice>
      )}

      {canScan && (
        <form onSubmit={onScan} className="space-y-2" aria-label="Scan">
          <label htmlFor="scan-code" className="block text-lg font-semibold">
            Scan or type a code, then Enter
          </label>
          <div className="flex flex-wrap gap-2">
            <input
              id="scan-code"
              ref={input}
              value={code}
              onChange={(e) => setCode(e.target.value)}
              onBlur={refocus}
              autoComplete="off"
              autoCapitalize="characters"
              spellCheck={false}
              enterKeyHint="send"
              className="num min-w-0 flex-1 rounded-lg border-2 border-ink bg-card px-4 py-3 text-2xl"
            />
            <label className="sr-only" htmlFor="scan-qty">
              Quantity (leave empty for 1)
            </label>
            <input id="scan-qty" value={qty} onChange={(e) => setQty(e.target.value.replace(/\D/g, ''))} inputMode="numeric" placeholder="Qty" className="num w-20 rounded-lg border-2 border-line bg-card px-2 py-3 text-center text-2xl" />
            <Button type="submit" variant="primary" className="px-6 py-3 text-lg">
              Enter
            </Button>
          </div>
          <Button className="w-full py-3 text-base sm:w-auto" onClick={() => setCamera((c) => !c)}>
            {camera ? 'Close camera' : 'Scan with camera'}
          </Button>
          {camera && <CameraScanner onCode={(c) => submit(c)} onClose={() => setCamera(false)} />}
        </form>
      )}

      <div aria-live="assertive" aria-atomic="true">
        {feedback && (
          <div data-testid="scan-feedback" data-ok={feedback.ok} className={`rounded-lg border-4 p-4 ${feedback.ok ? 'border-teal bg-teal-soft text-teal' : 'border-danger bg-danger-soft text-danger'}`}>
            <p className="flex items-center gap-3 text-2xl font-bold">
              <span aria-hidden="true" className="inline-flex h-9 w-9 shrink-0 items-center justify-center rounded-full border-4 border-current text-xl">
                {feedback.ok ? '✓' : '✕'}
              </span>
              {feedback.title}
            </p>
            <p className="mt-2 text-lg text-ink">{feedback.message}</p>
            {feedback.expected && <p className="mt-1 text-lg text-ink">Expected: {feedback.expected}</p>}
          </div>
        )}
      </div>

      {waiting.length > 0 && (
        <Notice tone="caution" title={`${waiting.length} scan${waiting.length === 1 ? '' : 's'} waiting to send${offline ? ': no connection' : ''}`}>
          <p>They are kept on this device and sent in order as soon as the connection is back.</p>
          <ul className="num mt-1 text-sm">
            {waiting.map((s) => (
              <li key={s.scanId}>
                {s.code}
                {s.qty ? ` × ${s.qty}` : ''} · waiting
              </li>
            ))}
          </ul>
        </Notice>
      )}

      {next && !done && (
        <section aria-labelledby="next-heading" className="rounded-lg border-2 border-ink bg-card p-4">
          <h2 id="next-heading" className="text-sm font-semibold uppercase tracking-wide text-ink-soft">
            {list.current ? 'Scan each unit’s serial' : 'Next'}
          </h2>
          <p className="num mt-1 text-3xl font-bold">{next.sku}</p>
          <p className="text-lg">{next.name}</p>
          <p className="num mt-1 text-xl">
            {next.places.map((p) => `${p.warehouse} ${p.bin}`).join(', ')} · {next.picked} of {next.qty}
          </p>
          {next.lithium && <p className="mt-2 text-base font-semibold text-[#7a4f12]">! {next.lithium}: heavy, two-person lift; keep terminal covers on.</p>}
        </section>
      )}

      <div className="flex flex-wrap gap-2">
        {list.abilities.complete && (
          <Button variant="primary" className="w-full px-6 py-4 text-xl sm:w-auto" disabled={complete.isPending || waiting.length > 0} onClick={() => complete.mutate()}>
            Complete pick
          </Button>
        )}
        {list.abilities.pause && (
          <Button className="px-5 py-3 text-lg" disabled={pause.isPending} onClick={() => pause.mutate('pause')}>
            Pause
          </Button>
        )}
        {list.abilities.resume && (
          <Button variant="primary" className="px-5 py-3 text-lg" disabled={pause.isPending} onClick={() => pause.mutate('resume')}>
            Resume pick
          </Button>
        )}
      </div>
      {complete.data && !complete.data.alreadyComplete && (
        <Notice tone="good" title="Pick complete">
          {complete.data.issued} units issued{complete.data.serials ? ` with ${complete.data.serials} serials` : ''}. The job is ready.
        </Notice>
      )}
      {(complete.error || pause.error) && <Notice tone="danger">{(complete.error ?? pause.error)!.message}</Notice>}

      <section aria-labelledby="lines-heading">
        <h2 id="lines-heading" className="mb-2 text-lg font-semibold">
          Lines in walking order
        </h2>
        {list.groups.map((g) => (
          <div key={g.warehouse} className="mb-3">
            <h3 className="text-sm font-semibold text-ink-soft">
              {g.warehouseName} ({g.warehouse})
            </h3>
            <ul className="divide-y divide-line rounded-lg border border-line bg-card">
              {g.lines.map((l) => {
                const lineDone = l.picked >= l.qty;
                return (
                  <li key={l.lineId} className="grid grid-cols-[minmax(0,1fr)_auto] items-start gap-x-4 px-3 py-2">
                    <span className="min-w-0">
                      <span className="num block break-all text-lg font-semibold">{l.sku}</span>
                      <span className="block text-sm text-ink-soft">{l.name}</span>
                      {l.serials.length > 0 && <span className="num block break-all text-sm">Serials: {l.serials.join(', ')}</span>}
                    </span>
                    <span className="text-right">
                      <span className={`num block text-xl font-semibold ${lineDone ? 'text-teal' : ''}`}>
                        <span aria-hidden="true">{lineDone ? '✓ ' : ''}</span>
                        {l.picked} / {l.qty}
                        <span className="sr-only">{lineDone ? ' picked' : ' to pick'}</span>
                      </span>
                      <span className="num block text-base">{l.places.map((p) => p.bin).join(', ')}</span>
                    </span>
                  </li>
                );
              })}
            </ul>
          </div>
        ))}
      </section>
    </div>
  );
}
