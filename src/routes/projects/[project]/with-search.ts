import type { ResolvedPathname } from '$app/types';

/**
 * A resolved path with a query string added (`search` starts with `?`, or is empty), still typed as a
 * resolved path: the query changes what a page shows, not which route it is.
 *
 * @example withSearch(resolve('/projects/[project]', { project: 'tidewatch' }), '?verdict=fail')
 */
export function withSearch(path: ResolvedPathname, search: string): ResolvedPathname {
  return `${path}${search}` as ResolvedPathname;
}
