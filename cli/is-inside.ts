import { isAbsolute, relative, sep } from 'node:path';

/**
 * True when `path` lies strictly below `folder` (both absolute, compared as written: resolve
 * symlinks with realpath first when they matter). The containment test for side files and
 * uploaded paths.
 */
export function isInside(folder: string, path: string): boolean {
  const fromFolder = relative(folder, path);
  return fromFolder !== '' && fromFolder !== '..' && !fromFolder.startsWith(`..${sep}`) && !isAbsolute(fromFolder);
}
