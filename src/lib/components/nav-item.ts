import type { ResolvedPathname } from '$app/types';

/** One link in the top bar's navigation or the user menu; build `href` with `resolve()` from `$app/paths`. */
export interface NavItem {
  href: ResolvedPathname;
  label: string;
}
