/**
 * Stable codes for the ways a file can fail to read. Reports, the API and the CLI show them,
 * so a code never changes meaning once shipped.
 */
export const ASSET_READ_ERROR_CODES = [
  /** The file has no bytes. */
  'asset.empty',
  /** Neither a GLB container nor glTF JSON. */
  'asset.not-gltf',
  /** A GLB container whose header or chunks are broken (truncated, lengths past the end). */
  'asset.glb-invalid',
  /** The JSON text does not parse, or is not UTF-8. */
  'asset.json-invalid',
  /** `asset.version` is not 2.x. */
  'asset.unsupported-version',
  /** The JSON parses but breaks the glTF schema or points at things that do not exist. */
  'asset.structure-invalid',
  /** A URI names a file outside the main file's folder (or uses a scheme): refused, never opened. */
  'asset.uri-outside-folder',
  /** A URI that cannot be decoded (malformed data URI, bad percent-encoding). */
  'asset.uri-invalid',
  /** A side file named by a URI was not provided. */
  'asset.side-file-missing',
  /** The caller failed to read a side file. */
  'asset.side-file-unreadable',
  /** A buffer holds fewer bytes than the file declares, or data lies past its end. */
  'asset.buffer-too-short',
  /** The file claims more decoded data than the read budget allows. */
  'asset.too-large',
  /** The file requires an extension this reader does not support. */
  'asset.extension-unsupported',
  /** The glTF reader failed on the file for another reason (the cause says which). */
  'asset.decode-failed'
] as const;

export type AssetReadErrorCode = (typeof ASSET_READ_ERROR_CODES)[number];

/**
 * A file that cannot be read as a glTF 2.0 asset: expected, caused by the file, shown to the user.
 * `lintAsset` turns it into one `asset-unreadable` finding whose message and hint come from here.
 *
 * @example
 * throw new AssetReadError('asset.side-file-missing', 'hero.gltf: buffer 0 names "hero.bin", which was not provided.',
 *   'Upload hero.bin next to hero.gltf, or embed the buffer.');
 */
export class AssetReadError extends Error {
  constructor(
    readonly code: AssetReadErrorCode,
    message: string,
    /** What the user can do about it, in one sentence. */
    readonly hint: string,
    options?: { cause?: unknown }
  ) {
    super(message, options);
    this.name = 'AssetReadError';
  }
}

/** True when `error` is an {@link AssetReadError} (also across bundle copies of this module). */
export function isAssetReadError(error: unknown): error is AssetReadError {
  return error instanceof AssetReadError || (error instanceof Error && error.name === 'AssetReadError');
}
