import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AdjustmentInput, CountInput, LedgerResult, ReceiptInput, TransferInput } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { stockKeys } from './keys.ts';

type Entry = { kind: 'adjustments'; input: AdjustmentInput } | { kind: 'transfers'; input: TransferInput } | { kind: 'receipts'; input: ReceiptInput } | { kind: 'counts'; input: CountInput };

export const recordMovement = (entry: Entry) => api<{ data: LedgerResult }>(`/stock/${entry.kind}`, { method: 'POST', body: entry.input }).then((r) => r.data);

/** Every stock change goes through the ledger; afterwards stock and jobs (backorders filled) are re-read. */
export function useRecordMovement() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: recordMovement,
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: stockKeys.all }), qc.invalidateQueries({ queryKey: ['jobs'] }) /* the jobs feature's key root */]),
  });
}
