/**
 * The parts of the glTF 2.0 JSON schema (glTF 2.0 §5, "Properties Reference") that the reader
 * relies on before handing the file to @gltf-transform/core: index fields are non-negative
 * integers, counts and lengths are integers, enums hold known values. Objects stay loose so
 * extensions and extras pass through untouched.
 */
import { z } from 'zod';

const index = z.number().int().nonnegative();
const byteOffset = z.number().int().nonnegative().optional();
const extensions = z.record(z.string(), z.unknown()).optional();

/** Accessor element types (glTF 2.0 §3.6.2, "Accessors") and their component counts. */
export const COMPONENTS_PER_ELEMENT = { SCALAR: 1, VEC2: 2, VEC3: 3, VEC4: 4, MAT2: 4, MAT3: 9, MAT4: 16 } as const;

/**
 * Bytes per component by componentType (glTF 2.0 §3.6.2, "Accessors"), plus half and double floats
 * from KHR_accessor_float16 / KHR_accessor_float64.
 */
export const COMPONENT_BYTE_SIZE: Readonly<Record<number, number>> = {
  5120: 1,
  5121: 1,
  5122: 2,
  5123: 2,
  5125: 4,
  5126: 4,
  5130: 8,
  5131: 2
};

const componentType = z
  .number()
  .int()
  .refine((value) => value in COMPONENT_BYTE_SIZE, { message: 'unknown componentType' });

const accessor = z.looseObject({
  bufferView: index.optional(),
  byteOffset,
  componentType,
  normalized: z.boolean().optional(),
  count: z.number().int().nonnegative(),
  type: z.enum(['SCALAR', 'VEC2', 'VEC3', 'VEC4', 'MAT2', 'MAT3', 'MAT4']),
  sparse: z
    .looseObject({
      count: z.number().int().positive(),
      indices: z.looseObject({
        bufferView: index,
        byteOffset,
        componentType: z.union([z.literal(5121), z.literal(5123), z.literal(5125)])
      }),
      values: z.looseObject({ bufferView: index, byteOffset })
    })
    .optional()
});

const meshoptView = z.looseObject({
  buffer: index,
  byteOffset,
  byteLength: z.number().int().nonnegative(),
  byteStride: z.number().int().positive(),
  count: z.number().int().nonnegative()
});

const numbers = (length: number) => z.array(z.number()).length(length).optional();

/** Validates the glTF JSON shape the reader depends on (glTF 2.0 §5). */
export const gltfJsonSchema = z.looseObject({
  asset: z.looseObject({ version: z.string() }),
  extensionsUsed: z.array(z.string()).optional(),
  extensionsRequired: z.array(z.string()).optional(),
  scene: index.optional(),
  scenes: z.array(z.looseObject({ nodes: z.array(index).optional() })).optional(),
  nodes: z
    .array(
      z.looseObject({
        children: z.array(index).optional(),
        mesh: index.optional(),
        skin: index.optional(),
        camera: index.optional(),
        matrix: numbers(16),
        rotation: numbers(4),
        scale: numbers(3),
        translation: numbers(3),
        name: z.string().optional()
      })
    )
    .optional(),
  buffers: z
    .array(z.looseObject({ uri: z.string().optional(), byteLength: z.number().int().nonnegative(), extensions }))
    .optional(),
  bufferViews: z
    .array(
      z.looseObject({
        buffer: index,
        byteOffset,
        byteLength: z.number().int().nonnegative(),
        byteStride: z.number().int().min(4).max(252).optional(),
        extensions: z.looseObject({ EXT_meshopt_compression: meshoptView.optional() }).optional()
      })
    )
    .optional(),
  accessors: z.array(accessor).optional(),
  images: z.array(z.looseObject({ uri: z.string().optional(), bufferView: index.optional() })).optional(),
  meshes: z
    .array(
      z.looseObject({
        primitives: z.array(
          z.looseObject({
            attributes: z.record(z.string(), index),
            indices: index.optional(),
            targets: z.array(z.record(z.string(), index)).optional(),
            material: index.optional(),
            extensions
          })
        )
      })
    )
    .optional(),
  skins: z
    .array(
      z.looseObject({
        joints: z.array(index).min(1),
        inverseBindMatrices: index.optional(),
        skeleton: index.optional()
      })
    )
    .optional(),
  animations: z
    .array(
      z.looseObject({
        name: z.string().optional(),
        samplers: z.array(
          z.looseObject({
            input: index,
            output: index,
            interpolation: z.enum(['LINEAR', 'STEP', 'CUBICSPLINE']).optional()
          })
        ),
        channels: z.array(
          z.looseObject({ sampler: index, target: z.looseObject({ node: index.optional(), path: z.string() }) })
        )
      })
    )
    .optional()
});

/** The glTF JSON after the shape check. */
export type GltfJson = z.infer<typeof gltfJsonSchema>;
