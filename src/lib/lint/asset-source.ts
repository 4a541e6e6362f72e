/**
 * How the lint library receives a file: bytes in, never a path to open.
 * The caller (CLI, server, browser) owns all I/O; this keeps the library pure and makes
 * "nothing outside the upload is opened" a property of the caller's `readSideFile`.
 */
export interface AssetSource {
  /** Path as submitted, forward slashes, relative to the build root (e.g. `chars/hero.gltf`). */
  path: string;
  /** The main file's bytes (`.glb` or `.gltf`). */
  bytes: Uint8Array;
  /**
   * Reads a side file (buffer or image) named by a URI of the main file, already decoded
   * and checked to stay inside the main file's folder, as a path relative to that folder.
   * Resolves null when the file was not provided.
   */
  readSideFile(relativePath: string): Promise<Uint8Array | null>;
}
