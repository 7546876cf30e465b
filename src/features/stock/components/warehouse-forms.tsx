import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { BinInputSchema, WarehouseInputSchema, type BinInput, type Warehouse, type WarehouseInput } from '@shared/contracts/stock.ts';
import { Button } from '@/components/ui/button.tsx';
import { TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { applyServerErrors } from '@/lib/form-errors.ts';
import { useSaveBin, useSaveWarehouse } from '../api/save-warehouse.ts';

export function WarehouseForm({ warehouse, onDone }: { warehouse?: Warehouse; onDone?: () => void }) {
  const save = useSaveWarehouse();
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<WarehouseInput>({ resolver: zodResolver(WarehouseInputSchema), defaultValues: warehouse ? { code: warehouse.code, name: warehouse.name, rank: warehouse.rank } : { code: '', name: '', rank: 1 } });
  const err = form.formState.errors;
  const submit = form.handleSubmit((input) => {
    setProblem(null);
    save.mutate(
      { id: warehouse?.id, input },
      {
        onSuccess: () => {
          if (!warehouse) form.reset({ code: '', name: '', rank: 1 });
          onDone?.();
        },
        onError: (e) => setProblem(applyServerErrors(e, form.setError, ['code', 'name', 'rank'])),
      },
    );
  });
  return (
    <form onSubmit={submit} noValidate aria-label={warehouse ? `Edit ${warehouse.code}` : 'Add a warehouse'} className="flex flex-wrap items-start gap-2">
      <TextField label="Code" mono className="w-28" error={err.code?.message} {...form.register('code')} />
      <TextField label="Name" className="w-56" error={err.name?.message} {...form.register('name')} />
      <TextField label="Rank" type="number" min={1} mono className="w-20" hint="1 is tried first" error={err.rank?.message} {...form.register('rank', { valueAsNumber: true })} />
      <Button type="submit" variant={warehouse ? 'secondary' : 'primary'} className="mt-5" disabled={save.isPending}>
        {warehouse ? 'Save' : 'Add warehouse'}
      </Button>
      {problem && <Notice tone="danger">{problem}</Notice>}
    </form>
  );
}

export function BinForm({ warehouseId, bin }: { warehouseId: string; bin?: { id: string; code: string; pickOrder: number } }) {
  const save = useSaveBin();
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<BinInput>({ resolver: zodResolver(BinInputSchema), defaultValues: bin ? { code: bin.code, pickOrder: bin.pickOrder } : { code: '', pickOrder: 0 } });
  const err = form.formState.errors;
  const submit = form.handleSubmit((input) => {
    setProblem(null);
    save.mutate(
      { warehouseId, binId: bin?.id, input },
      {
        onSuccess: () => {
          if (!bin) form.reset({ code: '', pickOrder: input.pickOrder + 10 });
        },
        onError: (e) => setProblem(applyServerErrors(e, form.setError, ['code', 'pickOrder'])),
      },
    );
  });
  return (
    <form onSubmit={submit} noValidate aria-label={bin ? `Bin ${bin.code}` : 'Add a bin'} className="flex flex-wrap items-start gap-2">
      <TextField label="Bin" mono className="w-28" error={err.code?.message} {...form.register('code')} />
      <TextField label="Pick order" type="number" min={0} mono className="w-24" error={err.pickOrder?.message} {...form.register('pickOrder', { valueAsNumber: true })} />
      <Button type="submit" variant={bin ? 'ghost' : 'secondary'} className="mt-5" disabled={save.isPending}>
        {bin ? 'Save' : 'Add bin'}
      </Button>
      {problem && <Notice tone="danger">{problem}</Notice>}
    </form>
  );
}
