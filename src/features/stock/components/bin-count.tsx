// A cycle count of one bin: load what the book says is there, scan (or type) what is really
// there — each scan counts one, a SKU, GTIN or GS1 label all name the part — adjust by hand, then
// post each difference as a count correction (the ledger keeps who and when).
import { useState, type FormEvent } from 'react';
import type { Warehouse } from '@shared/contracts/stock.ts';
import { api, ApiError } from '@/lib/api-client.ts';
import { Button } from '@/components/ui/button.tsx';
import { SelectField, TextField } from '@/components/ui/field.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { getStock } from '../api/get-stock.ts';
import { useRecordMovement } from '../api/record-movement.ts';

interface Row {
  sku: string;
  book: number;
  counted: number;
}

export function BinCountForm({ warehouses }: { warehouses: Warehouse[] }) {
  const [warehouse, setWarehouse] = useState('');
  const [bin, setBin] = useState('');
  const [rows, setRows] = useState<Row[] | null>(null);
  const [code, setCode] = useState('');
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [posted, setPosted] = useState<string[]>([]);
  const record = useRecordMovement();
  const binOptions = warehouses.find((w) => w.code === warehouse)?.bins ?? [];

  const load = async (e: FormEvent) => {
    e.preventDefault();
    setPosted([]);
    setMessage(null);
    const levels = await getStock({ warehouse, pageSize: 500 });
    setRows(levels.data.filter((l) => l.bin === bin.toUpperCase()).map((l) => ({ sku: l.sku, book: l.onHand, counted: 0 })));
  };

  const scan = async (e: FormEvent) => {
    e.preventDefault();
    const text = code.trim();
    setCode('');
    if (!text || !rows) return;
    try {
      const { data } = await api<{ data: { sku: string } }>('/parts/lookup', { query: { code: text } });
      setRows((rs) => {
        const list = rs ?? [];
        const found = list.find((r) => r.sku === data.sku);
        return found ? list.map((r) => (r === found ? { ...r, counted: r.counted + 1 } : r)) : [...list, { sku: data.sku, book: 0, counted: 1 }];
      });
      setMessage({ ok: true, text: `Counted 1 × ${data.sku}.` });
    } catch (err) {
      setMessage({ ok: false, text: err instanceof ApiError && err.status === 404 ? `No part has the code ${text}.` : (err as Error).message });
    }
  };

  const post = async () => {
    const done: string[] = [];
    for (const r of rows ?? []) {
      const res = await record.mutateAsync({ kind: 'counts', input: { sku: r.sku, warehouse, bin: bin.toUpperCase(), counted: r.counted, reason: `Cycle count of ${bin.toUpperCase()}` } });
      done.push(`${r.sku}: ${r.counted === r.book ? 'agrees with the book' : `${r.counted - r.book > 0 ? '+' : ''}${r.counted - r.book} (${res.reference})`}`);
    }
    setPosted(done);
    setRows(null);
  };

  return (
    <div className="space-y-3">
      <form onSubmit={load} aria-label="Choose the bin to count" className="flex flex-wrap items-end gap-2 rounded-lg border border-line bg-card p-4">
        <SelectField label="Warehouse" value={warehouse} onChange={(e) => setWarehouse(e.target.value)} options={warehouses.map((w) => ({ value: w.code, label: `${w.name} (${w.code})` }))} className="w-56">
          <option value="">Choose…</option>
        </SelectField>
        <TextField label="Bin" mono className="w-32" value={bin} onChange={(e) => setBin(e.target.value)} list="count-bins" />
        <datalist id="count-bins">
          {binOptions.map((b) => (
            <option key={b.id} value={b.code} />
          ))}
        </datalist>
        <Button type="submit" disabled={!warehouse || !bin}>
          Start counting
        </Button>
      </form>
      {rows && (
        <div className="space-y-3 rounded-lg border border-line bg-card p-4">
          <form onSubmit={scan} aria-label="Count by scanning" className="flex flex-wrap items-end gap-2">
            <TextField label="Scan or type a part's code, then Enter" mono className="min-w-0 flex-1" value={code} onChange={(e) => setCode(e.target.value)} autoComplete="off" />
            <Button type="submit">Count one</Button>
          </form>
          {message && <Notice tone={message.ok ? 'good' : 'danger'}>{message.text}</Notice>}
          <table className="w-full text-sm" aria-label={`Count of ${bin.toUpperCase()}`}>
            <thead>
              <tr className="border-b border-line text-left">
                <th scope="col" className="py-1">
                  SKU
                </th>
                <th scope="col" className="py-1 text-right">
                  Book
                </th>
                <th scope="col" className="py-1 text-right">
                  Counted
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.sku} className="border-b border-line/60">
                  <td className="num break-all py-1">{r.sku}</td>
                  <td className="num py-1 text-right">{r.book}</td>
                  <td className="py-1 text-right">
                    <label className="sr-only" htmlFor={`count-${r.sku}`}>
                      Counted {r.sku}
                    </label>
                    <input id={`count-${r.sku}`} type="number" min={0} value={r.counted} onChange={(e) => setRows((rs) => rs!.map((x) => (x === r ? { ...x, counted: Math.max(0, Number(e.target.value) || 0) } : x)))} className="num w-20 rounded border border-line px-1 text-right" />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <Button variant="primary" disabled={record.isPending || rows.length === 0} onClick={() => void post()}>
            Post the count
          </Button>
          {record.error && <Notice tone="danger">{record.error.message}</Notice>}
        </div>
      )}
      {posted.length > 0 && (
        <Notice tone="good" title="Count posted">
          <ul>
            {posted.map((p) => (
              <li key={p} className="num">
                {p}
              </li>
            ))}
          </ul>
        </Notice>
      )}
    </div>
  );
}
