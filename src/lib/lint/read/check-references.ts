/**
 * Cross-checks a shape-valid glTF JSON before @gltf-transform/core reads it: every index points
 * at something that exists, every accessor and buffer view lies inside the bytes actually present,
 * the node hierarchy is a forest (glTF 2.0 §3.5.2, "Nodes and Hierarchy": no node has two parents, no cycles), and the
 * data the reader would allocate stays within a budget. @gltf-transform/core trusts these facts;
 * checking them here turns a crash, a silent short read or a gigabyte allocation into a clear error.
 */
import { AssetReadError } from '../asset-read-error';
import { COMPONENTS_PER_ELEMENT, COMPONENT_BYTE_SIZE, type GltfJson } from './gltf-json-schema';

/** What the check needs besides the JSON. */
export interface ReferenceCheckInput {
  json: GltfJson;
  assetPath: string;
  /** Bytes of each buffer, in buffer order; null when the buffer has no data (a meshopt fallback buffer). */
  bufferBytes: readonly (Uint8Array | null)[];
  /**
   * Largest total the reader may allocate for accessor data and decoded meshopt views, plus the
   * float32 keys the rules walk for each rotation channel (counted per channel, shared or not).
   */
  maxDecodedByteLength: number;
}

/** @throws AssetReadError `asset.structure-invalid`, `asset.buffer-too-short` or `asset.too-large`. */
export function checkReferences(input: ReferenceCheckInput): void {
  const { json, assetPath } = input;
  const invalid = (where: string, what: string) =>
    new AssetReadError(
      'asset.structure-invalid',
      `${assetPath}: ${where} ${what}.`,
      'Export the asset again; the exporter or a hand edit wrote an invalid glTF file.'
    );
  const counts = {
    accessors: json.accessors?.length ?? 0,
    bufferViews: json.bufferViews?.length ?? 0,
    nodes: json.nodes?.length ?? 0,
    meshes: json.meshes?.length ?? 0,
    skins: json.skins?.length ?? 0,
    scenes: json.scenes?.length ?? 0,
    images: json.images?.length ?? 0,
    cameras: Array.isArray(json.cameras) ? json.cameras.length : 0,
    materials: Array.isArray(json.materials) ? json.materials.length : 0
  };
  const requireIndex = (value: number | undefined, kind: keyof typeof counts, where: string) => {
    if (value !== undefined && value >= counts[kind]) {
      throw invalid(where, `points at ${kind}[${value}], but the file has ${counts[kind]}`);
    }
  };
  let decodedByteLength = 0;
  const spend = (byteLength: number, where: string) => {
    decodedByteLength += byteLength;
    if (decodedByteLength > input.maxDecodedByteLength) {
      throw new AssetReadError(
        'asset.too-large',
        `${assetPath}: ${where} brings the data to decode to ${decodedByteLength} bytes, over the ` +
          `${input.maxDecodedByteLength}-byte limit for this file.`,
        'Check the file is not damaged; a real asset this large needs a higher read limit.'
      );
    }
  };

  const buffers = json.buffers ?? [];
  buffers.forEach((buffer, bufferIndex) => {
    const bytes = input.bufferBytes[bufferIndex];
    if (bytes && bytes.byteLength < buffer.byteLength) {
      throw new AssetReadError(
        'asset.buffer-too-short',
        `${assetPath}: buffers[${bufferIndex}] declares ${buffer.byteLength} bytes but holds ${bytes.byteLength}.`,
        'The buffer data is truncated: export the asset again or upload the complete side file.'
      );
    }
  });

  const viewHasData: boolean[] = [];
  (json.bufferViews ?? []).forEach((view, viewIndex) => {
    const where = `bufferViews[${viewIndex}]`;
    if (view.buffer >= buffers.length) throw invalid(where, `points at buffers[${view.buffer}], which does not exist`);
    const end = (view.byteOffset ?? 0) + view.byteLength;
    if (end > buffers[view.buffer].byteLength) {
      throw new AssetReadError(
        'asset.buffer-too-short',
        `${assetPath}: ${where} ends at byte ${end}, past the ${buffers[view.buffer].byteLength} bytes of buffers[${view.buffer}].`,
        'Export the asset again; its buffer views point past the end of their buffer.'
      );
    }
    const meshopt = view.extensions?.EXT_meshopt_compression;
    if (meshopt) {
      const source = input.bufferBytes[meshopt.buffer];
      if (meshopt.buffer >= buffers.length || !source) {
        throw invalid(
          `${where}.extensions.EXT_meshopt_compression`,
          `points at buffer ${meshopt.buffer}, which has no data`
        );
      }
      if ((meshopt.byteOffset ?? 0) + meshopt.byteLength > source.byteLength) {
        throw new AssetReadError(
          'asset.buffer-too-short',
          `${assetPath}: ${where} holds compressed data past the end of buffers[${meshopt.buffer}].`,
          'Export the asset again; the compressed data is truncated.'
        );
      }
      const decoded = meshopt.count * meshopt.byteStride;
      if (decoded < view.byteLength) {
        throw invalid(
          where,
          `decodes to ${decoded} bytes (count × byteStride), fewer than its byteLength ${view.byteLength}`
        );
      }
      spend(decoded, where);
      viewHasData[viewIndex] = true;
    } else {
      viewHasData[viewIndex] = input.bufferBytes[view.buffer] != null;
    }
  });

  const views = json.bufferViews ?? [];
  const checkRange = (viewIndex: number, offset: number, byteLength: number, where: string) => {
    requireIndex(viewIndex, 'bufferViews', where);
    if (!viewHasData[viewIndex]) throw invalid(where, `reads bufferViews[${viewIndex}], whose buffer has no data`);
    if (offset + byteLength > views[viewIndex].byteLength) {
      throw new AssetReadError(
        'asset.buffer-too-short',
        `${assetPath}: ${where} needs bytes ${offset}..${offset + byteLength} of bufferViews[${viewIndex}], ` +
          `which is ${views[viewIndex].byteLength} bytes long.`,
        'Export the asset again; the accessor claims more data than its buffer view holds.'
      );
    }
  };

  (json.accessors ?? []).forEach((accessor, accessorIndex) => {
    const where = `accessors[${accessorIndex}]`;
    const componentByteSize = COMPONENT_BYTE_SIZE[accessor.componentType];
    const elementByteSize = componentByteSize * COMPONENTS_PER_ELEMENT[accessor.type];
    // The reader allocates one tightly packed array per accessor, whatever the source.
    spend(accessor.count * elementByteSize, where);
    if (accessor.bufferView !== undefined && accessor.count > 0) {
      const stride = views[accessor.bufferView]?.byteStride ?? elementByteSize;
      checkRange(accessor.bufferView, accessor.byteOffset ?? 0, (accessor.count - 1) * stride + elementByteSize, where);
    }
    const sparse = accessor.sparse;
    if (sparse) {
      if (sparse.count > accessor.count) {
        throw invalid(`${where}.sparse.count`, `is ${sparse.count}, more than the accessor's count ${accessor.count}`);
      }
      const indexByteSize = COMPONENT_BYTE_SIZE[sparse.indices.componentType];
      checkRange(
        sparse.indices.bufferView,
        sparse.indices.byteOffset ?? 0,
        sparse.count * indexByteSize,
        `${where}.sparse.indices`
      );
      checkRange(
        sparse.values.bufferView,
        sparse.values.byteOffset ?? 0,
        sparse.count * elementByteSize,
        `${where}.sparse.values`
      );
    }
  });

  (json.images ?? []).forEach((image, imageIndex) => {
    if (image.bufferView !== undefined) checkRange(image.bufferView, 0, 0, `images[${imageIndex}]`);
    else if (image.uri === undefined) throw invalid(`images[${imageIndex}]`, 'has neither uri nor bufferView');
  });

  (json.meshes ?? []).forEach((mesh, meshIndex) =>
    mesh.primitives.forEach((primitive, primitiveIndex) => {
      const where = `meshes[${meshIndex}].primitives[${primitiveIndex}]`;
      for (const [semantic, accessorIndex] of Object.entries(primitive.attributes)) {
        requireIndex(accessorIndex, 'accessors', `${where}.attributes.${semantic}`);
      }
      requireIndex(primitive.indices, 'accessors', `${where}.indices`);
      for (const target of primitive.targets ?? []) {
        for (const [semantic, accessorIndex] of Object.entries(target)) {
          requireIndex(accessorIndex, 'accessors', `${where}.targets.${semantic}`);
        }
      }
      requireIndex(primitive.material, 'materials', `${where}.material`);
    })
  );

  checkNodes(json, requireIndex, invalid);

  (json.scenes ?? []).forEach((scene, sceneIndex) =>
    (scene.nodes ?? []).forEach((nodeIndex) => requireIndex(nodeIndex, 'nodes', `scenes[${sceneIndex}].nodes`))
  );
  requireIndex(json.scene, 'scenes', 'scene');

  (json.skins ?? []).forEach((skin, skinIndex) => {
    const where = `skins[${skinIndex}]`;
    skin.joints.forEach((nodeIndex) => requireIndex(nodeIndex, 'nodes', `${where}.joints`));
    requireIndex(skin.skeleton, 'nodes', `${where}.skeleton`);
    if (skin.inverseBindMatrices !== undefined) {
      requireIndex(skin.inverseBindMatrices, 'accessors', `${where}.inverseBindMatrices`);
      const matrices = json.accessors![skin.inverseBindMatrices];
      // glTF 2.0 §3.7.3, "Skins": one float MAT4 inverse bind matrix per joint.
      if (matrices.type !== 'MAT4' || matrices.count < skin.joints.length) {
        throw invalid(
          `${where}.inverseBindMatrices`,
          `is a ${matrices.type} accessor of ${matrices.count}; it needs at least ${skin.joints.length} MAT4 elements`
        );
      }
    }
  });

  (json.animations ?? []).forEach((animation, animationIndex) => {
    const where = `animations[${animationIndex}]`;
    animation.samplers.forEach((sampler, samplerIndex) => {
      requireIndex(sampler.input, 'accessors', `${where}.samplers[${samplerIndex}].input`);
      requireIndex(sampler.output, 'accessors', `${where}.samplers[${samplerIndex}].output`);
    });
    animation.channels.forEach((channel, channelIndex) => {
      if (channel.sampler >= animation.samplers.length) {
        throw invalid(
          `${where}.channels[${channelIndex}].sampler`,
          `points at sampler ${channel.sampler}, which does not exist`
        );
      }
      requireIndex(channel.target.node, 'nodes', `${where}.channels[${channelIndex}].target.node`);
      // The rules walk every key of every rotation channel, and many channels may share one
      // accessor: each use counts, so a small file cannot multiply the work past the budget.
      if (channel.target.path === 'rotation') {
        const sampler = animation.samplers[channel.sampler];
        spend(
          keyWorkOf(json.accessors![sampler.input]) + keyWorkOf(json.accessors![sampler.output]),
          `${where}.channels[${channelIndex}]`
        );
      }
    });
  });
}

/** Bytes of an accessor's elements read as float32, the form the rotation rules walk them in. */
function keyWorkOf(accessor: { count: number; type: keyof typeof COMPONENTS_PER_ELEMENT }): number {
  return accessor.count * 4 * COMPONENTS_PER_ELEMENT[accessor.type];
}

type RequireIndex = (value: number | undefined, kind: 'nodes' | 'meshes' | 'skins' | 'cameras', where: string) => void;

/** glTF 2.0 §3.5.2, "Nodes and Hierarchy": nodes form disjoint trees, so each node has at most one parent and no cycle exists. */
function checkNodes(json: GltfJson, requireIndex: RequireIndex, invalid: (where: string, what: string) => Error) {
  const nodes = json.nodes ?? [];
  const parents = new Int32Array(nodes.length).fill(-1);
  nodes.forEach((node, nodeIndex) => {
    const where = `nodes[${nodeIndex}]`;
    requireIndex(node.mesh, 'meshes', `${where}.mesh`);
    requireIndex(node.skin, 'skins', `${where}.skin`);
    requireIndex(node.camera, 'cameras', `${where}.camera`);
    for (const childIndex of node.children ?? []) {
      requireIndex(childIndex, 'nodes', `${where}.children`);
      if (parents[childIndex] !== -1) {
        throw invalid(`${where}.children`, `lists node ${childIndex}, already a child of node ${parents[childIndex]}`);
      }
      parents[childIndex] = nodeIndex;
    }
  });
  // With one parent each, a cycle shows as a parent chain that meets itself. Nodes already
  // proven to reach a root are marked, so the whole walk stays linear in the node count.
  const reachesRoot = new Uint8Array(nodes.length);
  const onChain = new Uint8Array(nodes.length);
  const chain: number[] = [];
  for (let nodeIndex = 0; nodeIndex < nodes.length; nodeIndex++) {
    let current = nodeIndex;
    while (current !== -1 && !reachesRoot[current]) {
      if (onChain[current]) throw invalid(`nodes[${current}]`, 'is its own ancestor (the node hierarchy has a cycle)');
      onChain[current] = 1;
      chain.push(current);
      current = parents[current];
    }
    for (const chainIndex of chain) reachesRoot[chainIndex] = 1;
    chain.length = 0;
  }
}
