import type { ProjectOverview, TrendPoint } from '$lib/types/project-overview';

/**
 * Invented sample data for the design sheet (Lanternfish Interactive's game "Tidewatch"). Timestamps are relative
 * to `now`, so relative times on the sheet always read naturally.
 */
export function sampleProjects(now: Date): ProjectOverview[] {
  const hoursAgo = (hours: number) => new Date(now.getTime() - hours * 3_600_000).toISOString();
  return [
    {
      slug: 'tidewatch-characters',
      name: 'Tidewatch · Characters',
      baseBranch: 'main',
      latest: {
        id: 412,
        verdict: 'fail',
        label: 'Harbour master idle v7',
        branch: 'anim/harbour-master',
        commitSha: '3f6a8bc3e21d4c0a9f1e2b3c4d5e6f708192a3b4',
        createdAt: hoursAgo(0.4)
      },
      open: { error: 3, warning: 14, info: 22 },
      trend: trend(now, [61, 58, 58, 52, 49, 50, 44, 41, 39, 39, 42, 39]),
      lastBuildAt: hoursAgo(0.4)
    },
    {
      slug: 'tidewatch-creatures',
      name: 'Tidewatch · Creatures',
      baseBranch: 'main',
      latest: {
        id: 388,
        verdict: 'pass',
        label: 'Gull flock wing cycle',
        branch: 'main',
        commitSha: 'a09e7c1d55b2e8f4c3a1d0e9f8a7b6c5d4e3f2a1',
        createdAt: hoursAgo(5)
      },
      open: { error: 0, warning: 2, info: 9 },
      trend: trend(now, [30, 27, 21, 18, 15, 13, 11, 11]),
      lastBuildAt: hoursAgo(5)
    },
    {
      slug: 'harbour-props',
      name: 'Harbour Props',
      baseBranch: 'develop',
      latest: {
        id: 97,
        verdict: 'pass',
        label: null,
        branch: 'develop',
        commitSha: null,
        createdAt: hoursAgo(50)
      },
      open: { error: 0, warning: 0, info: 0 },
      trend: trend(now, [0]),
      lastBuildAt: hoursAgo(50)
    },
    {
      slug: 'lighthouse-cinematics',
      name: 'Lighthouse Cinematics',
      baseBranch: 'main',
      latest: null,
      open: { error: 0, warning: 0, info: 0 },
      trend: [],
      lastBuildAt: null
    }
  ];
}

function trend(now: Date, totals: number[]): TrendPoint[] {
  return totals.map((total, index) => {
    const error = Math.round(total * 0.08);
    const warning = Math.round(total * 0.35);
    return {
      buildId: 1000 + index,
      createdAt: new Date(now.getTime() - (totals.length - index) * 86_400_000).toISOString(),
      error,
      warning,
      info: total - error - warning
    };
  });
}
