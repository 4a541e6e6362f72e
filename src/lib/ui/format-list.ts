/**
 * Names joined the way a sentence lists them, cut short past `maxNames`: `A`, `A and B`, `A, B and C`,
 * `A, B, C and 2 more`. For summaries such as "Harbour Props and Lighthouse Cinematics have no builds yet", where a
 * long list would push the point of the sentence off screen.
 */
export function formatList(names: readonly string[], maxNames = 3): string {
  if (names.length === 0) return '';
  if (names.length > maxNames) {
    return `${names.slice(0, maxNames).join(', ')} and ${names.length - maxNames} more`;
  }
  if (names.length === 1) return names[0];
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}
