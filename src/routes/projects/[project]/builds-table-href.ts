import type { BuildTableQuery } from '$lib/server/dashboard/list-build-table';

/** The builds table's state as it appears in the URL. */
export type BuildsTableState = BuildTableQuery;

const DEFAULTS: Pick<BuildsTableState, 'sort' | 'order' | 'page'> = { sort: 'time', order: 'desc', page: 1 };

/**
 * The query string (with `?`, or empty) of the builds table in `state` after `changes`.
 * Defaults are left out so shared links stay short; any change other than the page goes back to page 1.
 *
 * @example buildsTableSearch({ sort: 'time', order: 'desc', page: 3 }, { verdict: 'fail' }) → '?verdict=fail'
 */
export function buildsTableSearch(state: BuildsTableState, changes: Partial<BuildsTableState>): string {
  const next: BuildsTableState = { ...state, ...changes };
  if (!('page' in changes)) next.page = 1;
  const params = new URLSearchParams();
  if (next.branch) params.set('branch', next.branch);
  if (next.verdict) params.set('verdict', next.verdict);
  if (next.sort !== DEFAULTS.sort || next.order !== DEFAULTS.order) {
    params.set('sort', next.sort);
    params.set('order', next.order);
  }
  if (next.page !== DEFAULTS.page) params.set('page', String(next.page));
  const text = params.toString();
  return text ? `?${text}` : '';
}
