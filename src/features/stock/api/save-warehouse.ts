import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BinInput, WarehouseInput } from '@shared/contracts/stock.ts';
import { api } from '@/lib/api-client.ts';
import { stockKeys } from './keys.ts';

export const saveWarehouse = ({ id, input }: { id?: string; input: WarehouseInput }) =>
  api<{ data: { id: string } }>(id ? `/warehouses/${id}` : '/warehouses', { method: id ? 'PUT' : 'POST', body: input }).then((r) => r.data);

export const saveBin = ({ warehouseId, binId, input }: { warehouseId: string; binId?: string; input: BinInput }) =>
  api<{ data: { id: string } }>(binId ? `/warehouses/${warehouseId}/bins/${binId}` : `/warehouses/${warehouseId}/bins`, { method: binId ? 'PUT' : 'POST', body: input }).then((r) => r.data);

export function useSaveWarehouse() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: saveWarehouse, onSuccess: () => qc.invalidateQueries({ queryKey: stockKeys.warehouses() }) });
}

export function useSaveBin() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: saveBin, onSuccess: () => qc.invalidateQueries({ queryKey: stockKeys.warehouses() }) });
}
