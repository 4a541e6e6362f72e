/**
 * Finds the side file a `.gltf` names (buffer or image) among the dropped files: first at the
 * path relative to the main file's folder, as on disk; then, for files picked without their
 * folders, at the bare relative path and by file name alone. Pure, so it is tested without a browser.
 */

/** The dropped path that a main file's URI means, or null when none was dropped. */
export function findSidePath(mainPath: string, relativePath: string, droppedPaths: ReadonlySet<string>): string | null {
  const folder = mainPath.includes('/') ? mainPath.slice(0, mainPath.lastIndexOf('/')) : '';
  const candidates = [
    normalize(folder ? `${folder}/${relativePath}` : relativePath),
    normalize(relativePath),
    basename(relativePath)
  ];
  for (const candidate of candidates) if (droppedPaths.has(candidate)) return candidate;
  // Picked files have bare names: match the name alone, but only when exactly one dropped file has it.
  const name = basename(relativePath);
  const byName = [...droppedPaths].filter((path) => basename(path) === name);
  return byName.length === 1 ? byName[0] : null;
}

/** True for the files that are assets of their own (the rest are side files). */
export function isAssetPath(path: string): boolean {
  return /\.(glb|gltf)$/i.test(path);
}

function normalize(path: string): string {
  const parts: string[] = [];
  for (const part of path.split('/')) {
    if (part === '' || part === '.') continue;
    if (part === '..') parts.pop();
    else parts.push(part);
  }
  return parts.join('/');
}

function basename(path: string): string {
  return path.slice(path.lastIndexOf('/') + 1);
}
