// Scans leave the device in the order they were made. Each is written to the browser's storage
// before it is sent, so a scan made in a Wi-Fi dead spot (or before a reload) waits on the device,
// is shown as waiting, and goes when the connection returns, with the same scan id: the server
// applies an id once however often it arrives.
import { useCallback, useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { PickScanResult } from '@shared/contracts/warehouse.ts';
import { newScanId } from '@shared/domain/warehouse.ts';
import { ApiError } from '@/lib/api-client.ts';
import { sendScan } from '../api/send-scan.ts';
import { warehouseKeys } from '../api/keys.ts';

export interface QueuedScan {
  scanId: string;
  code: string;
  qty?: number;
  at: string;
}
export type ScanOutcome = { kind: 'result'; code: string; result: PickScanResult } | { kind: 'error'; code: string; message: string };

const RETRY_MS = 4000;
const storageKey = (jobId: string) => `stackyard.pick-queue.${jobId}`;

function load(jobId: string): QueuedScan[] {
  try {
    const raw = localStorage.getItem(storageKey(jobId));
    const parsed = raw ? (JSON.parse(raw) as unknown) : [];
    return Array.isArray(parsed) ? (parsed as QueuedScan[]).filter((s) => typeof s?.scanId === 'string' && typeof s.code === 'string') : [];
  } catch {
    return [];
  }
}
function save(jobId: string, queue: QueuedScan[]) {
  try {
    if (queue.length) localStorage.setItem(storageKey(jobId), JSON.stringify(queue));
    else localStorage.removeItem(storageKey(jobId));
  } catch {
    // Storage full or refused (private mode): the queue still lives in memory for this visit.
  }
}

/** True for failures a later resend can cure: no connection, a timeout, the server briefly down. */
function isTransient(e: unknown) {
  return !(e instanceof ApiError) || e.status >= 500 || e.status === 408 || e.status === 429;
}

export function useScanQueue(jobId: string, onOutcome: (o: ScanOutcome) => void) {
  const qc = useQueryClient();
  const [waiting, setWaiting] = useState<QueuedScan[]>(() => load(jobId));
  const [offline, setOffline] = useState(false);
  const queue = useRef<QueuedScan[]>(waiting);
  const sending = useRef(false);
  const outcome = useRef(onOutcome);
  useEffect(() => {
    outcome.current = onOutcome;
  }, [onOutcome]);

  const update = useCallback(
    (next: QueuedScan[]) => {
      queue.current = next;
      save(jobId, next);
      setWaiting(next);
    },
    [jobId],
  );

  const flush = useCallback(async () => {
    if (sending.current) return;
    sending.current = true;
    try {
      while (queue.current.length) {
        const scan = queue.current[0]!;
        try {
          const result = await sendScan(jobId, { code: scan.code, scanId: scan.scanId, ...(scan.qty ? { qty: scan.qty } : {}) });
          setOffline(false);
          update(queue.current.slice(1));
          outcome.current({ kind: 'result', code: scan.code, result });
        } catch (e) {
          if (isTransient(e)) {
            setOffline(true);
            return;
          }
          update(queue.current.slice(1));
          outcome.current({ kind: 'error', code: scan.code, message: (e as Error).message });
        }
      }
    } finally {
      sending.current = false;
      await qc.invalidateQueries({ queryKey: warehouseKeys.pick(jobId) });
    }
  }, [jobId, qc, update]);

  // Send what an earlier visit left waiting; retry while offline and as soon as the browser says the network is back.
  useEffect(() => {
    void flush();
    const retry = () => void flush();
    window.addEventListener('online', retry);
    const timer = window.setInterval(() => {
      if (queue.current.length) retry();
    }, RETRY_MS);
    return () => {
      window.removeEventListener('online', retry);
      window.clearInterval(timer);
    };
  }, [flush]);

  const submit = useCallback(
    (code: string, qty?: number) => {
      update([...queue.current, { scanId: newScanId(), code, qty, at: new Date().toISOString() }]);
      void flush();
    },
    [flush, update],
  );

  return { submit, waiting, offline, sending: sending.current };
}
