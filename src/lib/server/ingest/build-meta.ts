/**
 * The `meta` JSON part of a build upload: where the build comes from in version control and
 * CI. Validated here at the edge; everything below receives a typed {@link BuildMeta}.
 */
import { z } from 'zod';
import { ApiError } from './api-error';

/** Clock difference tolerated between a CI machine and the server. */
const FUTURE_SLACK_MS = 5 * 60_000;

/** Printable text without control characters, trimmed, of 1 to `max` characters: the rule for every free-text field. */
export const printableText = (max: number) =>
  z
    .string()
    .trim()
    .min(1, 'must not be empty')
    .max(max, `must be at most ${max} characters`)
    // eslint-disable-next-line no-control-regex -- control characters are what is refused
    .regex(/^[^\u0000-\u001f\u007f]*$/, 'must not contain control characters');

/** Schema of the `meta` part; unknown keys are refused so a misspelt field is noticed. */
export const buildMetaSchema = z
  .object({
    /** Commit id of the build (7 to 64 hex digits). */
    commit: z
      .string()
      .trim()
      .regex(/^[0-9a-f]{7,64}$/i, 'must be a commit id of 7 to 64 hex digits')
      .transform((value) => value.toLowerCase())
      .nullish(),
    /** Branch the build ran on; the baseline is chosen by it. */
    branch: printableText(255),
    /** Build number or label shown in lists, e.g. `#1482` or `nightly 2024-05-01`. */
    label: printableText(200).nullish(),
    /** Link back to the CI job. */
    ciJobUrl: z
      .url({ protocol: /^https?$/, error: 'must be an http(s) URL' })
      .max(2000)
      .nullish(),
    /** Any client-chosen key: a repeated upload with the same key answers the first build. */
    idempotencyKey: printableText(200).nullish(),
    /**
     * Without a key: true asks the server to derive one from the project, branch, commit, label
     * and every file's path and SHA-256 (derived-idempotency-key.ts), as `orientry submit` does.
     * A given key wins.
     */
    deriveIdempotencyKey: z.boolean().nullish(),
    /**
     * When CI built it (ISO 8601 with an offset); defaults to the time the upload arrives.
     * Lets an importer replay past builds in order so baselines and trends follow build time.
     * At most five minutes ahead of the server's clock.
     */
    builtAt: z.iso
      .datetime({ offset: true, error: 'must be an ISO 8601 time such as 2026-05-01T12:00:00Z' })
      .transform((value) => new Date(value))
      .refine((date) => date.getTime() <= Date.now() + FUTURE_SLACK_MS, 'must not be in the future')
      .nullish()
  })
  .strict();

/** The validated `meta` part. */
export type BuildMeta = z.infer<typeof buildMetaSchema>;

/**
 * Parses the text of the `meta` part.
 * @throws ApiError 400 `upload.meta_invalid` naming the bad field, e.g.
 *   `meta.branch: must not be empty. Send meta as JSON with at least {"branch": "main"}.`
 */
export function parseBuildMeta(json: string): BuildMeta {
  let value: unknown;
  try {
    value = JSON.parse(json);
  } catch (error) {
    throw new ApiError(400, 'upload.meta-invalid', `meta: not valid JSON (${(error as Error).message}). ${HINT}`, {
      cause: error
    });
  }
  const result = buildMetaSchema.safeParse(value);
  if (result.success) return result.data;
  const text = result.error.issues
    .map((issue) => `${['meta', ...issue.path.map(String)].join('.')}: ${issue.message}`)
    .join('; ');
  throw new ApiError(400, 'upload.meta-invalid', `${text}. ${HINT}`, { cause: result.error });
}

const HINT = 'Send meta as a JSON object such as {"branch": "main", "commit": "3f2a9c1", "label": "#1482"}.';
