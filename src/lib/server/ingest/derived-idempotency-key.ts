/**
 * The idempotency key the server derives for a build whose `meta` asks for one
 * (`deriveIdempotencyKey: true`) instead of naming one: the server answers a repeated key with
 * the build it already stored, so a CI job that is retried (same project, branch, commit, run
 * label and files) never makes a second build, while any change to the files or to where they
 * come from makes a new one.
 *
 * Design notes: `orientry submit` used to derive this key itself, hashing every file as it
 * streamed; the server hashes every file anyway (blobs are stored by content), so deriving it
 * here saves the CLI that second SHA-256 pass over the build (0.08 s of CPU per 100 MB, taken
 * from the upload on a CI machine that also runs the server or other jobs). The formula and the
 * `cli1-` prefix are unchanged, so builds stored by earlier CLIs still match.
 */
import { createHash } from 'node:crypto';

/** What the key is derived from. */
export interface IdempotencyInput {
  /** The project's slug. */
  project: string;
  branch: string;
  commit: string | null;
  label: string | null;
  /** Every uploaded file: its upload path and SHA-256 (order does not matter). */
  files: readonly { uploadPath: string; sha256: string }[];
}

/** Version of the derivation; bump it when the inputs change, so old and new keys never meet. */
const DERIVATION = 'orientry-submit-v1';

/**
 * `cli1-` and the SHA-256 (hex) of a canonical JSON text of the inputs, files sorted by path.
 * Paths are part of it: the same bytes under another name are another build.
 * @example deriveIdempotencyKey({ project: 'tidewatch', branch: 'main', commit: '3f2a9c1', label: '#12', files })
 *   // → 'cli1-5d0c…' (69 characters, within the limit of 200)
 */
export function deriveIdempotencyKey(input: IdempotencyInput): string {
  const files = [...input.files]
    .sort((a, b) => (a.uploadPath < b.uploadPath ? -1 : a.uploadPath > b.uploadPath ? 1 : 0))
    .map((file) => [file.uploadPath, file.sha256]);
  const canonical = JSON.stringify([DERIVATION, input.project, input.branch, input.commit, input.label, files]);
  return `cli1-${createHash('sha256').update(canonical, 'utf8').digest('hex')}`;
}
