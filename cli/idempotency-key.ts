/**
 * The default idempotency key of a submitted build. The server answers a repeated key with the
 * build it already stored, so a CI job that is retried (same project, branch, commit, run label
 * and files) re-uses its key and never makes a second build, while any change to the files or
 * to where they come from makes a new one.
 */
import { createHash } from 'node:crypto';

/** What the key is derived from. */
export interface IdempotencyInput {
  project: string;
  branch: string;
  commit: string;
  label: string | null;
  /** Every uploaded file: its upload path and SHA-256 (order does not matter). */
  files: readonly { uploadPath: string; sha256: string }[];
}

/** A derived key's shape: every derived key has this length, for sizing a body before the key is known. */
export const DERIVED_KEY_SHAPE = `cli1-${'0'.repeat(64)}`;

/** Version of the derivation; bump it when the inputs change, so old and new keys never meet. */
const DERIVATION = 'orientry-submit-v1';

/**
 * `cli1-` and the SHA-256 (hex) of a canonical JSON text of the inputs, files sorted by path.
 * Paths are part of it: the same bytes under another name are another build.
 * @example deriveIdempotencyKey({ project: 'tidewatch', branch: 'main', commit: '3f2a9c1', label: '#12', files })
 *   // → 'cli1-5d0c…' (69 characters, within the server's 200)
 */
export function deriveIdempotencyKey(input: IdempotencyInput): string {
  const files = [...input.files]
    .sort((a, b) => (a.uploadPath < b.uploadPath ? -1 : a.uploadPath > b.uploadPath ? 1 : 0))
    .map((file) => [file.uploadPath, file.sha256]);
  const canonical = JSON.stringify([DERIVATION, input.project, input.branch, input.commit, input.label, files]);
  return `cli1-${createHash('sha256').update(canonical, 'utf8').digest('hex')}`;
}
