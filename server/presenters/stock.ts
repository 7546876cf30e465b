import type { Movement } from '@shared/contracts/stock.ts';
import type { StockService } from '../services/stock.ts';

type MovementRow = Awaited<ReturnType<StockService['movements']>>['rows'][number];

export function presentMovement(r: MovementRow): Movement {
  return {
    id: r.id,
    at: r.at.toISOString(),
    sku: r.sku,
    name: r.name,
    warehouse: r.warehouse,
    bin: r.bin,
    qty: r.qty,
    kind: r.kind,
    reason: r.reason,
    reference: r.reference,
    job: r.jobId && r.jobReference ? { id: r.jobId, reference: r.jobReference } : null,
    by: r.by,
  };
}
