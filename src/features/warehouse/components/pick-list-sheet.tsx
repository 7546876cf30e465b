// The pick list on paper: A4, black and white, lines by warehouse in bin order, a box to tick,
// and the lithium handling notes on every line with cells.
import type { PickList } from '@shared/contracts/warehouse.ts';
import { LITHIUM_REMINDERS } from '@shared/domain/warehouse.ts';
import { formatDate } from '@/lib/format.ts';

export function PickListSheet({ list }: { list: PickList }) {
  return (
    <article className="print-ink mx-auto max-w-3xl bg-card p-4 text-black sm:p-8">
      <header className="border-b-2 border-black pb-2">
        <h2 className="text-2xl font-bold">Pick list · {list.job.reference}</h2>
        <p>
          {list.job.company}
          {list.job.siteSuburb ? ` · site ${list.job.siteSuburb}${list.job.sitePostcode ? ` ${list.job.sitePostcode}` : ''}` : ''} · printed {formatDate(new Date())}
        </p>
        <p className="num">
          {list.progress.units} units on {list.progress.lines} lines
        </p>
        {list.job.notes && <p className="mt-1">Notes: {list.job.notes}</p>}
      </header>
      {list.groups.map((g) => (
        <section key={g.warehouse} className="mt-4 break-inside-avoid-page">
          <h3 className="text-lg font-bold">
            {g.warehouseName} ({g.warehouse})
          </h3>
          <table className="mt-1 w-full border-collapse text-sm">
            <thead>
              <tr className="border-b border-black text-left">
                <th scope="col" className="py-1 pr-2">
                  Bin
                </th>
                <th scope="col" className="py-1 pr-2">
                  Part
                </th>
                <th scope="col" className="py-1 pr-2 text-right">
                  Qty
                </th>
                <th scope="col" className="py-1 text-center">
                  Picked
                </th>
              </tr>
            </thead>
            <tbody>
              {g.lines.map((l) => (
                <tr key={l.lineId} className="break-inside-avoid border-b border-black/40 align-top">
                  <td className="num py-1.5 pr-2 font-semibold max-sm:break-all sm:whitespace-nowrap">{l.places.map((p) => (p.needsTransfer ? `${p.bin} (transfer first)` : p.bin)).join(', ')}</td>
                  <td className="py-1.5 pr-2">
                    <span className="num break-all font-semibold">{l.sku}</span> {l.name}
                    {l.serialised && <span className="block">Serialised: scan each unit’s serial.</span>}
                    {l.lithium && (
                      <span className="mt-1 block border border-black p-1 text-xs">
                        <strong>{l.lithium}.</strong> {LITHIUM_REMINDERS.map((r) => r.charAt(0).toUpperCase() + r.slice(1)).join('. ')}.
                      </span>
                    )}
                  </td>
                  <td className="num py-1.5 pr-2 text-right text-base font-bold">{l.qty}</td>
                  <td className="py-1.5 text-center">
                    <span aria-hidden="true" className="inline-block h-5 w-5 border-2 border-black" />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      ))}
      <footer className="mt-6 grid grid-cols-2 gap-6 text-sm">
        <p className="border-t border-black pt-1">Picked by</p>
        <p className="border-t border-black pt-1">Checked by</p>
      </footer>
    </article>
  );
}
