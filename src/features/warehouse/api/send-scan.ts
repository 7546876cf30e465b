import type { PickScanInput, PickScanResult } from '@shared/contracts/warehouse.ts';
import { api } from '@/lib/api-client.ts';

/** One scan to the server; the scan id makes a resend harmless (the server applies it once). */
export const sendScan = (jobId: string, scan: PickScanInput) => api<{ data: PickScanResult }>(`/jobs/${encodeURIComponent(jobId)}/pick/scans`, { method: 'POST', body: scan }).then((r) => r.data);
