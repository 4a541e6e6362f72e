/**
 * The asset view's query string for a channel and, optionally, the finding selected on it:
 * `?channel=0:3&finding=812`. The server reads the same names to pick what the first paint shows.
 * Channel ids are two integers around a colon, safe in a query as they are, so they stay readable.
 */
export function channelSearch(channelId: string, findingId: number | null): string {
  const channel = /^\d+:\d+$/.test(channelId) ? channelId : encodeURIComponent(channelId);
  return findingId === null ? `?channel=${channel}` : `?channel=${channel}&finding=${findingId}`;
}
