/**
 * Files a person drops on the check page (or picks with the file input), with the path they
 * had in the dropped folder, so a `.gltf` finds its `.bin` and images the way it would on disk.
 * Folders are walked through the browser's entry API; nothing is uploaded.
 */

/** One dropped file and its path relative to what was dropped (forward slashes). */
export interface DroppedFile {
  path: string;
  file: File;
}

/** Folders deeper than this are not walked: a dropped project root should not freeze the page. */
const MAX_FOLDER_DEPTH = 8;

/** The files of a drop, walking dropped folders. */
export async function filesFromDataTransfer(transfer: DataTransfer): Promise<DroppedFile[]> {
  const entries = [...transfer.items]
    .map((item) => (item.kind === 'file' ? item.webkitGetAsEntry() : null))
    .filter((entry): entry is FileSystemEntry => entry !== null);
  if (entries.length === 0) return filesFromList(transfer.files);
  const files: DroppedFile[] = [];
  for (const entry of entries) await walk(entry, '', files, 0);
  return files;
}

/** The files picked in a file input (with their folder path when a folder was picked). */
export function filesFromList(list: FileList | null): DroppedFile[] {
  return [...(list ?? [])].map((file) => ({ path: file.webkitRelativePath || file.name, file }));
}

async function walk(entry: FileSystemEntry, prefix: string, files: DroppedFile[], depth: number): Promise<void> {
  const path = prefix ? `${prefix}/${entry.name}` : entry.name;
  if (entry.isFile) {
    const file = await new Promise<File>((resolve, reject) => (entry as FileSystemFileEntry).file(resolve, reject));
    files.push({ path, file });
    return;
  }
  if (!entry.isDirectory || depth >= MAX_FOLDER_DEPTH) return;
  const reader = (entry as FileSystemDirectoryEntry).createReader();
  // readEntries hands out a folder in batches; an empty batch means the end.
  for (;;) {
    const batch = await new Promise<FileSystemEntry[]>((resolve, reject) => reader.readEntries(resolve, reject));
    if (batch.length === 0) break;
    for (const child of batch) await walk(child, path, files, depth + 1);
  }
}
