import type { Severity } from '$lib/lint/finding';

/**
 * Display words for severities, singular and plural. Severity badges always show a word next to the icon so the
 * meaning never rests on colour alone; this is the one place those words are spelled.
 */
export const SEVERITY_LABEL: Record<Severity, { one: string; many: string }> = {
  error: { one: 'Error', many: 'Errors' },
  warning: { one: 'Warning', many: 'Warnings' },
  info: { one: 'Info', many: 'Info' }
};
