/**
 * Structure-aware damage to a glTF JSON: random values with a bias towards the numbers and
 * strings a reader branches on (component types, element types, index edges, 2^31, 2^32,
 * 2^53), and random edits at random places (replace, delete, duplicate, swap, insert).
 */
import type { FuzzRandom } from './fuzz-random';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

const INTERESTING_NUMBERS = [
  0,
  -0,
  1,
  -1,
  2,
  3,
  4,
  9,
  16,
  64,
  255,
  256,
  65535,
  65536,
  0.5,
  -0.5,
  1e-45,
  1e38,
  1e308,
  -1e308,
  2 ** 31 - 1,
  2 ** 31,
  2 ** 32 - 1,
  2 ** 32,
  2 ** 53 - 1,
  2 ** 53 + 2,
  5120,
  5121,
  5122,
  5123,
  5125,
  5126,
  5130,
  5131,
  34962
];
const INTERESTING_STRINGS = [
  '',
  'SCALAR',
  'VEC3',
  'VEC4',
  'MAT4',
  'rotation',
  'translation',
  'weights',
  'scale',
  'LINEAR',
  'STEP',
  'CUBICSPLINE',
  'KHR_draco_mesh_compression',
  'EXT_meshopt_compression',
  'KHR_texture_transform',
  '2.0',
  '__proto__',
  'constructor',
  'x'.repeat(2000),
  '<script>window.__xss=1</script>'
];
const GLTF_KEYS = [
  'accessors',
  'bufferViews',
  'buffers',
  'nodes',
  'animations',
  'samplers',
  'channels',
  'target',
  'node',
  'path',
  'input',
  'output',
  'interpolation',
  'count',
  'byteOffset',
  'byteLength',
  'byteStride',
  'componentType',
  'type',
  'normalized',
  'sparse',
  'children',
  'skins',
  'joints',
  'inverseBindMatrices',
  'rotation',
  'matrix',
  'scale',
  'translation',
  'extensionsUsed',
  'extensionsRequired',
  'extensions',
  'uri',
  'mesh',
  'skin',
  'scene',
  'scenes',
  '__proto__'
];

/** A random JSON value, nested at most `depth` levels. */
export function randomJsonValue(random: FuzzRandom, depth = 3): Json {
  const roll = random.integer(0, 9);
  if (roll <= 3) return random.chance(0.7) ? random.pick(INTERESTING_NUMBERS) : random.integer(-1000, 100_000);
  if (roll <= 5) return random.pick(INTERESTING_STRINGS);
  if (roll === 6) return random.chance(0.5) ? null : random.chance(0.5);
  if (depth <= 0) return random.integer(0, 8);
  if (roll === 7 || roll === 8) {
    const length = random.integer(0, 5);
    return Array.from({ length }, () => randomJsonValue(random, depth - 1));
  }
  const object: { [key: string]: Json } = {};
  const keyCount = random.integer(0, 4);
  for (let index = 0; index < keyCount; index++) {
    setKey(object, random.pick(GLTF_KEYS), randomJsonValue(random, depth - 1));
  }
  return object;
}

/** Sets an own key, also `__proto__`, so the JSON text really carries it (plain assignment would set the prototype). */
function setKey(object: { [key: string]: Json }, key: string, value: Json): void {
  Object.defineProperty(object, key, { value, enumerable: true, writable: true, configurable: true });
}

/** Applies `editCount` random edits to `root` in place and returns it (the root may be replaced). */
export function mutateJson(root: Json, random: FuzzRandom, editCount: number): Json {
  let current = root;
  for (let edit = 0; edit < editCount; edit++) current = mutateOnce(current, random);
  return current;
}

function mutateOnce(root: Json, random: FuzzRandom): Json {
  const containers = collectContainers(root);
  if (containers.length === 0) return randomJsonValue(random);
  const container = random.pick(containers);
  if (Array.isArray(container)) {
    if (container.length === 0) {
      container.push(randomJsonValue(random));
      return root;
    }
    const index = random.integer(0, container.length - 1);
    switch (random.integer(0, 4)) {
      case 0:
        container[index] = randomJsonValue(random);
        break;
      case 1:
        container.splice(index, 1);
        break;
      case 2:
        container.push(structuredClone(container[index]));
        break;
      case 3: {
        const other = random.integer(0, container.length - 1);
        [container[index], container[other]] = [container[other], container[index]];
        break;
      }
      default:
        container.length = index;
    }
    return root;
  }
  const keys = Object.keys(container);
  if (keys.length === 0 || random.chance(0.15)) {
    setKey(container, random.pick(GLTF_KEYS), randomJsonValue(random));
    return root;
  }
  const key = random.pick(keys);
  switch (random.integer(0, 3)) {
    case 0:
    case 1:
      setKey(container, key, randomJsonValue(random));
      break;
    case 2:
      delete container[key];
      break;
    default: {
      const value = container[key];
      setKey(container, key, typeof value === 'number' ? random.pick(INTERESTING_NUMBERS) : randomJsonValue(random, 1));
    }
  }
  return root;
}

function collectContainers(root: Json): (Json[] | { [key: string]: Json })[] {
  const found: (Json[] | { [key: string]: Json })[] = [];
  const stack: Json[] = [root];
  while (stack.length > 0) {
    const value = stack.pop()!;
    if (value === null || typeof value !== 'object') continue;
    found.push(value);
    for (const child of Array.isArray(value) ? value : Object.values(value)) stack.push(child);
  }
  return found;
}
