/**
 * A count with its noun in the right number: `1 error`, `3 errors`, `0 warnings`.
 * For labels read by screen readers and in summaries; pass the plural when it is not the singular plus "s".
 */
export function plural(count: number, singular: string, pluralForm = `${singular}s`): string {
  return `${count.toLocaleString('en-GB')} ${count === 1 ? singular : pluralForm}`;
}
