/** `1 error`, `2 errors`: a count with its noun, for one-line summaries on stderr. */
export function plural(count: number, noun: string): string {
  return `${count} ${noun}${count === 1 ? '' : 's'}`;
}
