// The installer's handover sheet on screen (the PDF carries the same): job, system, every serial by part, cautions.
import type { Handover } from '@shared/contracts/warehouse.ts';
import { formatDate, formatNumber } from '@/lib/format.ts';

export function HandoverSheet({ h }: { h: Handover }) {
  const site = [h.job.siteSuburb, h.job.sitePostcode].filter(Boolean).join(' ');
  return (
    <article className="print-ink mx-auto max-w-3xl space-y-5 rounded-lg border border-line bg-card p-4 sm:p-8">
      <header>
        <h2 className="text-2xl font-bold">Handover sheet · {h.job.reference}</h2>
        <p>
          {h.job.company}
          {site ? ` · site ${site}` : ''} · {formatDate(h.date)}
        </p>
        {h.job.contact && <p>Contact: {h.job.contact}</p>}
      </header>
      <section aria-labelledby="system-heading">
        <h3 id="system-heading" className="border-b border-line text-lg font-semibold">
          System
        </h3>
        {h.systems.length === 0 && <p className="mt-1">This job was not made from a stack plan: see the parts below.</p>}
        {h.systems.map((s) => (
          <div key={s.name} className="mt-2">
            <p className="font-semibold">
              {s.name} <span className="font-normal text-ink-soft">({s.rangeName})</span>
            </p>
            <dl className="mt-1 grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-4">
              <Figure term="Stacks × modules" value={`${s.stacks} × ${s.modulesPerStack} (${s.modules})`} />
              <Figure term="Usable" value={`${formatNumber(s.usableKwh)} kWh`} />
              <Figure term="Nominal voltage" value={`${formatNumber(s.nominalVoltage)} V`} />
              <Figure term="DVC class" value={`DVC-${s.dvc}`} />
            </dl>
          </div>
        ))}
      </section>
      <section aria-labelledby="serials-heading">
        <h3 id="serials-heading" className="border-b border-line text-lg font-semibold">
          Serial numbers
        </h3>
        {h.serials.length === 0 && <p className="mt-1">No serial numbers have been issued to this job yet: they are captured when the kit is picked.</p>}
        {h.serials.map((p) => (
          <div key={p.sku} className="mt-2">
            <p>
              <span className="num font-semibold">{p.sku}</span> {p.name} ({p.serials.length})
            </p>
            <ul className="num mt-1 flex flex-wrap gap-x-4 gap-y-1">
              {p.serials.map((s) => (
                <li key={s}>{s}</li>
              ))}
            </ul>
          </div>
        ))}
      </section>
      <section aria-labelledby="parts-heading">
        <h3 id="parts-heading" className="border-b border-line text-lg font-semibold">
          Parts supplied
        </h3>
        <ul className="mt-1">
          {h.lines.map((l, i) => (
            <li key={`${l.sku}-${i}`}>
              <span className="num">
                {l.qty} × {l.sku}
              </span>{' '}
              {l.name}
            </li>
          ))}
        </ul>
      </section>
      <section aria-labelledby="cautions-heading">
        <h3 id="cautions-heading" className="border-b border-line text-lg font-semibold">
          Installation cautions
        </h3>
        <ul className="mt-1 list-disc space-y-1 pl-5">
          {h.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>
    </article>
  );
}

function Figure({ term, value }: { term: string; value: string }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{term}</dt>
      <dd className="num">{value}</dd>
    </div>
  );
}
