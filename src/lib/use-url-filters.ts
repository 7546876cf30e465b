import { useSearchParams } from 'react-router';

/** List filters kept in the URL (shareable, survive reload); changing a filter goes back to page 1. */
export function useUrlFilters() {
  const [params, setParams] = useSearchParams();
  const get = (key: string) => params.get(key) || undefined;
  const set = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    if (key !== 'page') next.delete('page');
    setParams(next, { replace: true });
  };
  const page = Number(params.get('page') ?? 1) || 1;
  return { get, set, page, setPage: (n: number) => set('page', String(n)) };
}
