/**
 * Removes KHR_draco_mesh_compression from a glTF JSON when no Draco decoder was supplied, so the
 * rest of the file (animations, nodes, skins) still reads. Compressed primitives keep their
 * attributes, but the accessors that only Draco could fill get count 0: the geometry is skipped
 * instead of being allocated as zero-filled arrays of whatever size the file claims.
 */
import type { GltfJson } from './gltf-json-schema';

const DRACO = 'KHR_draco_mesh_compression';

/** True when the JSON names KHR_draco_mesh_compression as used or required. */
export function usesDraco(json: GltfJson): boolean {
  return Boolean(json.extensionsUsed?.includes(DRACO) || json.extensionsRequired?.includes(DRACO));
}

/**
 * Strips Draco from `json` in place.
 * @returns the number of primitives whose geometry is skipped.
 */
export function stripDraco(json: GltfJson): number {
  let skippedPrimitives = 0;
  for (const mesh of json.meshes ?? []) {
    for (const primitive of mesh.primitives) {
      if (!primitive.extensions || !(DRACO in primitive.extensions)) continue;
      const { [DRACO]: _removed, ...otherExtensions } = primitive.extensions;
      primitive.extensions = otherExtensions;
      skippedPrimitives++;
      const accessorIndices = [...Object.values(primitive.attributes)];
      if (primitive.indices !== undefined) accessorIndices.push(primitive.indices);
      for (const accessorIndex of accessorIndices) {
        const accessor = json.accessors?.[accessorIndex];
        // An accessor with a bufferView is uncompressed fallback data and still reads.
        if (accessor && accessor.bufferView === undefined && !accessor.sparse) accessor.count = 0;
      }
    }
  }
  json.extensionsUsed = json.extensionsUsed?.filter((name) => name !== DRACO);
  json.extensionsRequired = json.extensionsRequired?.filter((name) => name !== DRACO);
  return skippedPrimitives;
}
