import type { FindingFilter } from '$lib/server/dashboard/finding-filter';

/**
 * The query string (with `?`, or empty) for the build report's finding filters: the report's own URL
 * and the API's finding list take the same names. Empty filters and page 1 are left out.
 *
 * @example findingFilterSearch({ status: 'new', page: 1 }) → '?status=new'
 */
export function findingFilterSearch(filter: FindingFilter): string {
  const params = new URLSearchParams();
  for (const name of ['rule', 'severity', 'status', 'asset'] as const) {
    const value = filter[name];
    if (value !== undefined) params.set(name, value);
  }
  if (filter.page > 1) params.set('page', String(filter.page));
  const text = params.toString();
  return text ? `?${text}` : '';
}
