/**
 * The asset view's query string for a channel and, optionally, the finding selected on it:
 * `?channel=0:3&finding=812`. The server reads the same names to pick what the first paint shows.
 */
export function channelSearch(channelId: string, findingId: number | null): string {
  const params = new URLSearchParams({ channel: channelId });
  if (findingId !== null) params.set('finding', String(findingId));
  return `?${params}`;
}
