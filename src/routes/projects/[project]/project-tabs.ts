import { base } from '$app/paths';
import type { ResolvedPathname } from '$app/types';

/** One tab of a project's sub-navigation. */
export interface ProjectTab {
  label: string;
  href: ResolvedPathname;
  /** True when the tab stands for the page at `pathname` (or one below it). */
  isCurrent: (pathname: string) => boolean;
}

/**
 * The tabs under a project: Builds, Trends, Waivers and, for leads and admins, Settings.
 * Builds also owns the build report and asset pages below `/builds/`.
 */
export function projectTabs(slug: string, canManage: boolean): ProjectTab[] {
  const root = `${base}/projects/${encodeURIComponent(slug)}`;
  const under = (path: string) => (pathname: string) => pathname === path || pathname.startsWith(`${path}/`);
  const tabs: ProjectTab[] = [
    {
      label: 'Builds',
      href: root as ResolvedPathname,
      isCurrent: (pathname) => pathname === root || pathname === `${root}/` || under(`${root}/builds`)(pathname)
    },
    { label: 'Trends', href: `${root}/trends` as ResolvedPathname, isCurrent: under(`${root}/trends`) },
    { label: 'Waivers', href: `${root}/waivers` as ResolvedPathname, isCurrent: under(`${root}/waivers`) }
  ];
  if (canManage) {
    tabs.push({
      label: 'Settings',
      href: `${root}/settings` as ResolvedPathname,
      isCurrent: under(`${root}/settings`)
    });
  }
  return tabs;
}
