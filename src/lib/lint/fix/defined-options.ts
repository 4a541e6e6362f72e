/**
 * Options with undefined fields dropped, so spreading them over defaults keeps the default:
 * `{ ...DEFAULTS, ...withoutUndefined({ tolerance: undefined }) }` still has DEFAULTS.tolerance.
 * The fixes use it because fixDocument passes policy values that may be absent.
 */
export function withoutUndefined<T extends object>(options: T): Partial<T> {
  return Object.fromEntries(Object.entries(options).filter(([, value]) => value !== undefined)) as Partial<T>;
}
