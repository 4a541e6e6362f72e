/**
 * The one buffer every generated document keeps its accessors in.
 * glTF-Transform needs each accessor attached to a buffer before writing; the generators and
 * defect injectors share this helper so a document never grows a second buffer by accident.
 */
import type { Buffer, Document } from '@gltf-transform/core';

/** The document's first buffer, created when it has none. */
export function getOrCreateBuffer(document: Document): Buffer {
  return document.getRoot().listBuffers()[0] ?? document.createBuffer();
}
