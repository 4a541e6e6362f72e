import type { ResolvedPathname } from '$app/types';

/** One step of a breadcrumb trail; omit `href` for the current page. Build `href` with `resolve()`. */
export interface Crumb {
  label: string;
  href?: ResolvedPathname;
}
