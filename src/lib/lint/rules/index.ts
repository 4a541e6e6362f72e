/**
 * Every rule, in report order. `asset-unreadable` is not here: the reader emits it when a
 * file cannot be read at all.
 */
import type { Rule } from './rule';

export const RULES: readonly Rule[] = [];
