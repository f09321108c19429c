import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';

export interface ListParams {
  page: number;
  pageSize: number;
  sort: string | undefined;
  q: string;
  /** Any further filter, by name (approvalStatus, calibration, construction…). */
  filters: Record<string, string | undefined>;
}

/**
 * A list's page, sort, search text and filters live in the address, so a filtered view can be
 * bookmarked, shared, and survives going back from a detail page.
 */
export function useListParams(filterNames: readonly string[], defaults: { pageSize?: number; sort?: string } = {}) {
  const [sp, setSp] = useSearchParams();
  const key = filterNames.join('|');
  const params: ListParams = useMemo(() => {
    const filters: Record<string, string | undefined> = {};
    for (const f of key ? key.split('|') : []) filters[f] = sp.get(f) ?? undefined;
    return {
      page: Math.max(1, Number(sp.get('page')) || 1),
      pageSize: defaults.pageSize ?? 25,
      sort: sp.get('sort') ?? defaults.sort,
      q: sp.get('q') ?? '',
      filters,
    };
  }, [sp, key, defaults.pageSize, defaults.sort]);

  /** Changes some parameters; anything but the page itself sends you back to page 1. */
  const update = useCallback(
    (patch: Partial<{ page: number; sort: string | undefined; q: string }> & { filters?: Record<string, string | undefined> }) => {
      setSp(
        (prev) => {
          const next = new URLSearchParams(prev);
          const set = (k: string, v: string | number | undefined) => (v === undefined || v === '' ? next.delete(k) : next.set(k, String(v)));
          if ('sort' in patch) set('sort', patch.sort);
          if ('q' in patch) set('q', patch.q);
          for (const [k, v] of Object.entries(patch.filters ?? {})) set(k, v);
          if ('page' in patch) set('page', patch.page && patch.page > 1 ? patch.page : undefined);
          else next.delete('page');
          return next;
        },
        { replace: true },
      );
    },
    [setSp],
  );
  return [params, update] as const;
}
