/**
 * The first characters of a commit hash, the way people quote commits in chat: `3f6a8bc`.
 * Seven characters is git's own default abbreviation; the full hash belongs in a `title` beside it.
 */
export function shortSha(commitSha: string, length = 7): string {
  const trimmed = commitSha.trim();
  return /^[0-9a-f]+$/i.test(trimmed) ? trimmed.slice(0, length).toLowerCase() : trimmed.slice(0, length);
}
