/**
 * What a person may send to propose or decide a waiver, validated with zod at the edge (form
 * actions and the JSON API share these schemas), so the rest of the code gets typed terms that
 * match exactly what the gate compares: a 16-hex fingerprint, or a rule id and an asset path
 * written as builds store it (forward slashes, relative, no `./`).
 */
import { z } from 'zod';
import { RULE_IDS } from '../../lint/rule-ids';

/** Longest reason or note kept, in characters (the column allows 4000). */
export const WAIVER_TEXT_MAX = 4000;

/** Empty form fields count as absent. */
const optionalText = (schema: z.ZodString) =>
  z.preprocess((value) => (typeof value === 'string' && value.trim() === '' ? undefined : value), schema.optional());

/** An asset path as the build stores it: `./` dropped, backslashes turned, no absolute or `..` paths. */
const assetPathSchema = z
  .string()
  .trim()
  .min(1, 'Enter the asset path, as the build report shows it.')
  .max(1024, 'Asset paths are at most 1024 characters.')
  .transform((path) => path.replace(/\\/g, '/').replace(/^(\.\/)+/, ''))
  .refine((path) => !path.startsWith('/') && !path.split('/').includes('..'), {
    message: 'Use the path relative to the build root, as the build report shows it (no leading / or ..).'
  });

/** A calendar day `YYYY-MM-DD`; the waiver holds until the end of that day (UTC). */
const expiryDaySchema = z.iso.date('Enter the expiry as a date (YYYY-MM-DD) or leave it empty.');

/**
 * A proposal. `scope` picks the waiver kind: `fingerprint` covers one finding (its fingerprint,
 * stable across re-exports); `rule-asset` covers every finding of one rule in one asset.
 */
export const proposeWaiverSchema = z
  .object({
    scope: z.enum(['fingerprint', 'rule-asset'], 'Choose what the waiver covers.'),
    fingerprint: optionalText(
      z
        .string()
        .trim()
        .toLowerCase()
        .regex(/^[0-9a-f]{16}$/, 'A fingerprint is 16 hexadecimal digits; copy it from the finding.')
    ),
    rule: optionalText(z.string().trim()).pipe(z.enum(RULE_IDS, 'Choose the rule this waiver covers.').optional()),
    assetPath: z.preprocess(
      (value) => (typeof value === 'string' && value.trim() === '' ? undefined : value),
      assetPathSchema.optional()
    ),
    reason: z
      .string('Say why this finding is acceptable.')
      .trim()
      .min(1, 'Say why this finding is acceptable.')
      .max(WAIVER_TEXT_MAX, `Keep the reason under ${WAIVER_TEXT_MAX} characters.`),
    expiresOn: optionalText(z.string()).pipe(expiryDaySchema.optional())
  })
  .superRefine((input, context) => {
    if (input.scope === 'fingerprint' && !input.fingerprint) {
      context.addIssue({ code: 'custom', path: ['fingerprint'], message: 'Enter the finding’s fingerprint.' });
    }
    if (input.scope === 'rule-asset') {
      if (!input.rule) context.addIssue({ code: 'custom', path: ['rule'], message: 'Choose the rule.' });
      if (!input.assetPath) {
        context.addIssue({ code: 'custom', path: ['assetPath'], message: 'Enter the asset path.' });
      }
    }
  });

export type ProposeWaiverInput = z.output<typeof proposeWaiverSchema>;

/** A decision on a waiver: what a lead does, with an optional note for the history. */
export const waiverDecisionSchema = z.object({
  action: z.enum(['approve', 'reject', 'revoke'], 'Choose approve, reject or revoke.'),
  note: optionalText(z.string().trim().max(WAIVER_TEXT_MAX, `Keep the note under ${WAIVER_TEXT_MAX} characters.`))
});

export type WaiverDecisionInput = z.output<typeof waiverDecisionSchema>;

/** The moment a waiver expiring on `day` (YYYY-MM-DD) stops holding: the end of that day, UTC. */
export function expiryMomentOf(day: string): Date {
  return new Date(`${day}T23:59:59.999Z`);
}
