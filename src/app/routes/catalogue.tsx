import { useCallback, useEffect, useRef, useState, type KeyboardEvent } from 'react';
import { Link, useLocation, useNavigate } from 'react-router';
import { useQueryClient } from '@tanstack/react-query';
import type { SortingState } from '@tanstack/react-table';
import type { PartListQuery } from '@shared/contracts/parts.ts';
import { Page } from '@/components/ui/page.tsx';
import { TextField } from '@/components/ui/field.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { paths } from '@/config/paths.ts';
import { hasAbility, useMe } from '@/features/auth/api/get-me.ts';
import { formatNumber } from '@/lib/format.ts';
import { CATALOGUE_SEARCH_ID, isTyping, SHORTCUT_LABELS, useSearchShortcut } from '@/lib/search-shortcut.ts';
import { partsExportHref, partsQueryOptions, useParts, type PartFilters } from '@/features/catalogue/api/get-parts.ts';
import { useMakers } from '@/features/catalogue/api/get-makers.ts';
import { useRanges } from '@/features/catalogue/api/get-ranges.ts';
import { FILTER_KEYS, useCatalogueParams, type FilterKey } from '@/features/catalogue/hooks/use-catalogue-params.ts';
import { FacetPanel, facetLabeller } from '@/features/catalogue/components/facet-panel.tsx';
import { PartsTable } from '@/features/catalogue/components/parts-table.tsx';

const PAGE_SIZE = 50;
/** Long enough to skip the middle of a word, short enough to feel instant. */
const TYPING_PAUSE_MS = 120;

const FILTER_TITLES: Record<FilterKey, string> = { category: 'Category', maker: 'Maker', range: 'Range', lifecycle: 'Lifecycle', inStock: 'Availability' };

export function CatalogueRoute() {
  const { data: me } = useMe();
  const navigate = useNavigate();
  const qc = useQueryClient();
  const { filters, update } = useCatalogueParams();
  const { data: makers = [] } = useMakers();
  const { data: ranges = [] } = useRanges();
  const search = useRef<HTMLInputElement>(null);
  const results = useRef<HTMLDivElement>(null);

  // What is in the box; it reaches the URL (and so the query) after a short pause in typing.
  const urlQ = filters.q ?? '';
  const [text, setText] = useState(urlQ);
  const pushed = useRef(urlQ);
  const pushQ = useCallback(
    (q: string) => {
      pushed.current = q;
      update({ q }, { replace: true });
    },
    [update],
  );
  useEffect(() => {
    // The URL changed under us (Back, a shared link), not by typing: the box follows it.
    if (urlQ === pushed.current) return;
    pushed.current = urlQ;
    setText(urlQ);
  }, [urlQ]);
  useEffect(() => {
    const q = text.trim();
    if (q === pushed.current) return;
    const t = setTimeout(() => pushQ(q), TYPING_PAUSE_MS);
    return () => clearTimeout(t);
  }, [text, pushQ]);

  const query: PartFilters = { ...filters, pageSize: PAGE_SIZE };
  const { data, error, isLoading, isFetching, isPlaceholderData } = useParts(query);

  // Arriving by the search shortcut puts the cursor in the box; an ordinary visit leaves focus
  // at the top of the page, so the skip link and the navigation come first.
  const location = useLocation();
  const arrivedByShortcut = (location.state as { focusSearch?: boolean } | null)?.focusSearch === true;
  useEffect(() => {
    if (arrivedByShortcut) search.current?.focus();
  }, [arrivedByShortcut]);
  const shortcut = useSearchShortcut();
  // Typing while focus is not in a field goes into the search box, so a scanner works the moment
  // the page opens. That is a single-key shortcut too, so it follows the same setting (only
  // with "/"; WCAG 2.1.4).
  useEffect(() => {
    if (shortcut !== '/') return;
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (isTyping(document.activeElement) || e.key.length !== 1 || e.key === '/' || e.key === ' ' || e.ctrlKey || e.metaKey || e.altKey) return;
      // Focus moves before the key is handled, so the character lands in the box.
      search.current?.focus();
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [shortcut]);
  const [filtersOpen, setFiltersOpen] = useState(false);

  const firstRow = () => results.current?.querySelector<HTMLElement>('tbody [data-row-action]');

  const onSearchKey = async (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'ArrowDown') {
      const row = firstRow();
      if (row) {
        e.preventDefault();
        row.focus();
      }
      return;
    }
    if (e.key !== 'Enter') return;
    e.preventDefault();
    const q = text.trim();
    if (!q) return;
    // A scanner types the whole code then Enter, faster than the pause: ask for exactly this
    // code now (or join the request already on its way) and open the part it names.
    if (q !== pushed.current) pushQ(q);
    try {
      const res = await qc.fetchQuery(partsQueryOptions({ ...filters, q, page: undefined, pageSize: PAGE_SIZE }));
      if (res.exactSku && search.current?.value.trim() === q) navigate(paths.part.href(res.exactSku));
    } catch {
      // The failed search shows its own message under the box.
    }
  };

  const onResultsKey = (e: KeyboardEvent<HTMLDivElement>) => {
    if (e.key === 'ArrowUp' && e.target === firstRow()) search.current?.focus();
  };

  const label = facetLabeller(makers, ranges);
  const pick = (key: FilterKey, value: string | undefined) => update({ [key]: value } as PartFilters);
  const active = FILTER_KEYS.filter((k) => filters[k] !== undefined);

  // Without words the server lists by SKU (A→Z), and the table says so (aria-sort).
  const sorting: SortingState = filters.sort && filters.sort !== 'relevance' ? [{ id: filters.sort, desc: filters.dir === 'desc' }] : urlQ ? [] : [{ id: 'sku', desc: false }];
  const onSortingChange = (s: SortingState) =>
    s[0] ? update({ sort: s[0].id as PartListQuery['sort'], dir: s[0].desc ? 'desc' : 'asc' }) : update({ sort: undefined, dir: undefined });

  // Supplier SKUs find parts only for the roles that may see supplier data (the server decides).
  const codes = hasAbility(me, 'suppliers.view') ? 'SKU, GTIN or supplier SKU' : 'SKU or GTIN';
  const total = data?.total ?? 0;
  const page = data?.page ?? filters.page ?? 1;
  const pages = Math.max(1, Math.ceil(total / (data?.pageSize ?? PAGE_SIZE)));
  const q = urlQ;
  const empty = isLoading
    ? 'Looking…'
    : total > 0 && page > pages
      ? `This page is past the last one: the search has ${pages} ${pages === 1 ? 'page' : 'pages'}. Use Previous, or change the search.`
      : q
      ? `No part matches “${q}”${active.length ? ' with these filters' : ''}. Check the spelling or try fewer words${active.length ? ', or clear a filter' : ''}. A scanned code must be the whole ${codes}.`
      : 'No parts have these filters. Clear a filter to see more.';

  return (
    <Page
      title="Catalogue"
      subtitle={`Every part we carry, from every maker: search by words, ${codes}.`}
      actions={
        <>
          <Link to={paths.catalogueBrowse.href()} className="inline-flex items-center gap-2 rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
            Browse by maker or range
          </Link>
          <a href={partsExportHref(filters)} download className="inline-flex items-center gap-2 rounded-md border border-line bg-card px-3 py-1.5 text-sm font-medium hover:border-ink-soft">
            <span aria-hidden="true">⤓</span>Export CSV
          </a>
          {hasAbility(me, 'catalogue.edit') && (
            <Link to={paths.partNew.href()} className="inline-flex items-center gap-2 rounded-md border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
              New part
            </Link>
          )}
        </>
      }
    >
      <div className="grid gap-x-4 md:grid-cols-[12rem_minmax(0,1fr)] md:grid-rows-[auto_1fr]">
        <div className="min-w-0 md:col-start-2 md:row-start-1">
          <div role="search" className="mb-3">
            <TextField
              ref={search}
              id={CATALOGUE_SEARCH_ID}
              label="Search the catalogue"
              type="search"
              autoComplete="off"
              spellCheck={false}
              placeholder="e.g. cable cover, HLM-TOR-M5, 0614141100012"
              hint={
                <>
                  {shortcut === 'off' ? (
                    'The search shortcut is off (your menu can turn it on). '
                  ) : (
                    <>
                      Press <kbd className="rounded border border-line bg-paper px-1">{SHORTCUT_LABELS[shortcut]}</kbd> to search from anywhere (change it in your menu).{' '}
                    </>
                  )}
                  Press <kbd className="rounded border border-line bg-paper px-1">↓</kbd> to move into the results. Scan a barcode to open its part.
                </>
              }
              value={text}
              onChange={(e) => setText(e.target.value)}
              onKeyDown={onSearchKey}
            />
          </div>

          <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
            <Button className="md:hidden" aria-expanded={filtersOpen} aria-controls="catalogue-filters" onClick={() => setFiltersOpen((o) => !o)}>
              {filtersOpen ? 'Hide filters' : `Filters${active.length ? ` (${active.length})` : ''}`}
            </Button>
            <p data-testid="result-count" aria-live="polite" className="font-semibold">
              {data ? `${formatNumber(total)} ${total === 1 ? 'part' : 'parts'}` : isLoading ? 'Searching…' : ''}
            </p>
            {(isFetching || isPlaceholderData) && data && <span className="text-xs text-ink-soft">updating…</span>}
            {active.map((k) => (
              <button
                key={k}
                type="button"
                onClick={() => pick(k, undefined)}
                className="inline-flex items-center gap-1 rounded-full border border-ink/30 bg-card px-2 py-0.5 text-xs hover:border-ink"
                aria-label={`Remove filter ${FILTER_TITLES[k]}: ${label(k, String(filters[k]))}`}
              >
                <span className="text-ink-soft">{FILTER_TITLES[k]}:</span>
                <span className="font-medium">{label(k, String(filters[k]))}</span>
                <span aria-hidden="true">✕</span>
              </button>
            ))}
            {active.length > 1 && (
              <Button variant="ghost" className="px-2 py-0.5 text-xs" onClick={() => update(Object.fromEntries(FILTER_KEYS.map((k) => [k, undefined])) as PartFilters)}>
                Clear all filters
              </Button>
            )}
          </div>

          {error && (
            <div className="mb-3">
              <Notice tone="danger" title="The search did not answer.">
                {error.message} Try again in a moment; if it keeps failing, tell your administrator.
              </Notice>
            </div>
          )}

        </div>
        {/* On a phone the filters fold away behind a button under the search box, so the search comes first (and comes first in the tab order on a desk too). */}
        <aside id="catalogue-filters" className={`md:sticky md:top-4 md:col-start-1 md:row-span-2 md:row-start-1 md:self-start ${filtersOpen ? 'mb-3' : 'max-md:hidden'}`}>
          <FacetPanel facets={data?.facets} filters={filters} label={label} onPick={pick} />
        </aside>
        <div className="min-w-0 md:col-start-2 md:row-start-2">
          <div ref={results} onKeyDown={onResultsKey}>
            <PartsTable data={data?.data ?? []} sorting={sorting} onSortingChange={onSortingChange} empty={empty} />
          </div>

          {data && total > 0 && (
            <nav aria-label="Pages" className="mt-2 flex flex-wrap items-center justify-between gap-2 text-sm">
              <p className="text-ink-soft">
                Page <span className="num">{page}</span> of <span className="num">{pages}</span> · <span className="num">{formatNumber(total)}</span> {total === 1 ? 'part' : 'parts'}
              </p>
              <div className="flex gap-2">
                <Button disabled={page <= 1} onClick={() => update({ page: page - 1 })}>
                  ← Previous
                </Button>
                <Button disabled={page >= pages} onClick={() => update({ page: page + 1 })}>
                  Next →
                </Button>
              </div>
            </nav>
          )}
        </div>
      </div>
    </Page>
  );
}
