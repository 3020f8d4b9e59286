'use client';

import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import { FILTER_KEYS, listSearch } from '@/lib/schemas/complexes';

/**
 * The complexes list as the address bar holds it (filters, sort, page), so a bookmark reopens
 * the same view and back/forward step through earlier views. Keys of other parts of the page
 * (the complexes page's `run`) are kept as they are.
 */
export function useListParams() {
  const router = useRouter();
  const pathname = usePathname();
  const params = useSearchParams();
  const list = listSearch(params);
  const page = Math.max(1, Number(params.get('page')) || 1);
  const pageSize = Math.max(1, Math.min(500, Number(params.get('pageSize')) || 50));

  /** A new history entry with `patch` applied (null or '' removes a key). */
  function update(patch: Record<string, string | null>) {
    const next = new URLSearchParams(params.toString());
    for (const [k, v] of Object.entries(patch)) {
      if (v === null || v === '') next.delete(k);
      else next.set(k, v);
    }
    const qs = next.toString();
    router.push(qs ? `${pathname}?${qs}` : pathname, { scroll: false });
  }

  /** Replaces every filter with `filters`, back on the first page. */
  function setFilters(filters: Record<string, string>) {
    const patch: Record<string, string | null> = { page: null };
    for (const k of FILTER_KEYS) patch[k] = filters[k] ?? null;
    update(patch);
  }

  const filters: Record<string, string> = {};
  for (const k of FILTER_KEYS) {
    const v = list.get(k);
    if (v !== null) filters[k] = v;
  }
  return {
    /** Filters and sort only: what the complex pages carry to move through the same list. */
    list,
    filters,
    sort: list.get('sort') ?? 'id',
    desc: list.get('dir') === 'desc',
    page,
    pageSize,
    update,
    setFilters,
  };
}
