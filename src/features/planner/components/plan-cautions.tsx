import type { Caution } from '@shared/domain/planner.ts';

/** The cautions that apply, each with the standard that governs it; licensed work comes first and loudest. */
export function PlanCautions({ cautions }: { cautions: Caution[] }) {
  const licensed = cautions.find((c) => c.code === 'licensed_work');
  const rest = cautions.filter((c) => c !== licensed);
  return (
    <section aria-labelledby="cautions-heading" className="space-y-2">
      <h2 id="cautions-heading" className="text-base font-semibold">
        Cautions
      </h2>
      {licensed && (
        <div role="note" className="flex gap-3 rounded-md border-2 border-amber bg-amber-soft px-3 py-2.5 print:border-black print:bg-white" data-testid="caution-licensed_work">
          <span aria-hidden="true" className="mt-0.5 inline-flex h-6 w-6 shrink-0 items-center justify-center rounded-full border-2 border-amber text-sm font-bold text-[#7a4f12] print:border-black print:text-black">
            !
          </span>
          <div>
            <p className="font-semibold text-[#7a4f12] print:text-black">Licensed electrical work</p>
            <p className="text-sm">{licensed.text}</p>
            <p className="mt-0.5 text-xs text-ink-soft print:text-black">{licensed.source}</p>
          </div>
        </div>
      )}
      <ul className="divide-y divide-line rounded-md border border-line bg-card print:bg-white">
        {rest.map((c) => (
          <li key={c.code} className="flex gap-2.5 px-3 py-2" data-testid={`caution-${c.code}`}>
            <span aria-hidden="true" className="mt-0.5 inline-flex h-4 w-4 shrink-0 items-center justify-center rounded-full border border-amber text-[10px] font-bold text-amber print:border-black print:text-black">
              !
            </span>
            <div>
              <p className="text-sm">{c.text}</p>
              <p className="text-xs text-ink-soft print:text-black">{c.source}</p>
            </div>
          </li>
        ))}
      </ul>
    </section>
  );
}
