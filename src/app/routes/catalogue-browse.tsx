import { Link } from 'react-router';
import { CATEGORY_CODES, CATEGORY_LABELS } from '@shared/contracts/part-attributes.ts';
import { Page, Card } from '@/components/ui/page.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { useMakers } from '@/features/catalogue/api/get-makers.ts';
import { useRanges } from '@/features/catalogue/api/get-ranges.ts';
import { useParts } from '@/features/catalogue/api/get-parts.ts';

const filtered = (key: string, value: string) => paths.catalogue.href(new URLSearchParams({ [key]: value }).toString());

/** The catalogue by maker, category and range: each entry opens the catalogue filtered to it. */
export function CatalogueBrowseRoute() {
  const makers = useMakers();
  const ranges = useRanges();
  const counts = useParts({ pageSize: 1 });
  const categoryCounts = counts.data?.facets.category ?? {};
  const rangeCounts = counts.data?.facets.range ?? {};
  const error = makers.error ?? ranges.error ?? counts.error;

  return (
    <Page title="Browse the catalogue" subtitle="By maker, by kind of part, or by the range a part belongs to.">
      {error && <Notice tone="danger">{error.message}</Notice>}
      <div className="grid gap-4 lg:grid-cols-3">
        <Card>
          <h2 className="mb-2 font-semibold">Makers</h2>
          <ul className="divide-y divide-line">
            {(makers.data ?? []).map((m) => (
              <li key={m.code}>
                <Link to={filtered('maker', m.code)} className="flex justify-between py-1.5 hover:text-copper">
                  <span>
                    {m.name} <span className="num text-xs text-ink-soft">{m.code}</span>
                  </span>
                  <span className="num text-ink-soft">{m.parts}</span>
                </Link>
              </li>
            ))}
          </ul>
        </Card>
        <Card>
          <h2 className="mb-2 font-semibold">Kinds of part</h2>
          <ul className="divide-y divide-line">
            {CATEGORY_CODES.map((c) => (
              <li key={c}>
                <Link to={filtered('category', c)} className="flex justify-between py-1.5 hover:text-copper">
                  <span>{CATEGORY_LABELS[c]}</span>
                  <span className="num text-ink-soft">{categoryCounts[c] ?? 0}</span>
                </Link>
              </li>
            ))}
          </ul>
        </Card>
        <Card>
          <h2 className="mb-2 font-semibold">Ranges</h2>
          <ul className="divide-y divide-line">
            {(ranges.data ?? []).map((r) => (
              <li key={r.code} className="py-1.5">
                <Link to={filtered('range', r.code)} className="flex justify-between hover:text-copper">
                  <span>{r.name}</span>
                  <span className="num text-ink-soft">{rangeCounts[r.code] ?? 0}</span>
                </Link>
                <p className="text-xs text-ink-soft">
                  {r.makerName} · {r.connection === 'series' ? 'series' : 'parallel'} · {r.minModules}–{r.maxModules} modules per stack
                </p>
              </li>
            ))}
          </ul>
        </Card>
      </div>
    </Page>
  );
}
