/**
 * Tiny low-poly shapes (a prism per limb, a box per prop part) and the glTF mesh that holds them.
 * The demo lints rotations, not geometry, so a few triangles per part are enough to show the
 * rig in a viewer while keeping every file in the tens of kilobytes.
 */
import type { Document, Mesh } from '@gltf-transform/core';
import { getOrCreateBuffer } from './gltf-buffer';
import type { Vec3 } from './quaternion';

/** Positions (3 per vertex) and triangle indices of one shape. */
export interface Shape {
  positions: number[];
  indices: number[];
}

/** A triangular prism of `radius` from `start` to `end`: 6 vertices, 8 triangles. */
export function prismBetween(start: Readonly<Vec3>, end: Readonly<Vec3>, radius: number): Shape {
  const direction = normalize3([end[0] - start[0], end[1] - start[1], end[2] - start[2]]);
  // Any vector not parallel to the limb gives a perpendicular frame.
  const helper: Vec3 = Math.abs(direction[1]) < 0.9 ? [0, 1, 0] : [1, 0, 0];
  const u = normalize3(cross(direction, helper));
  const v = cross(direction, u);
  const positions: number[] = [];
  for (const base of [start, end]) {
    for (let corner = 0; corner < 3; corner++) {
      const angle = (corner * 2 * Math.PI) / 3;
      const [c, s] = [Math.cos(angle) * radius, Math.sin(angle) * radius];
      positions.push(base[0] + u[0] * c + v[0] * s, base[1] + u[1] * c + v[1] * s, base[2] + u[2] * c + v[2] * s);
    }
  }
  const indices = [0, 2, 1, 3, 4, 5];
  for (let i = 0; i < 3; i++) {
    const j = (i + 1) % 3;
    indices.push(i, j, 3 + j, i, 3 + j, 3 + i);
  }
  return { positions, indices };
}

/** An axis-aligned box of `size` centred on `center`: 8 vertices, 12 triangles. */
export function box(size: Readonly<Vec3>, center: Readonly<Vec3> = [0, 0, 0]): Shape {
  const positions: number[] = [];
  for (let corner = 0; corner < 8; corner++) {
    positions.push(
      center[0] + (corner & 1 ? 0.5 : -0.5) * size[0],
      center[1] + (corner & 2 ? 0.5 : -0.5) * size[1],
      center[2] + (corner & 4 ? 0.5 : -0.5) * size[2]
    );
  }
  // prettier-ignore
  const indices = [0, 2, 1, 1, 2, 3, 4, 5, 6, 5, 7, 6, 0, 1, 4, 1, 5, 4, 2, 6, 3, 3, 6, 7, 0, 4, 2, 2, 4, 6, 1, 3, 5, 3, 7, 5];
  return { positions, indices };
}

/** Joins shapes into one, renumbering indices. */
export function mergeShapes(shapes: readonly Shape[]): Shape {
  const merged: Shape = { positions: [], indices: [] };
  for (const shape of shapes) {
    const offset = merged.positions.length / 3;
    merged.positions.push(...shape.positions);
    merged.indices.push(...shape.indices.map((index) => index + offset));
  }
  return merged;
}

/** A one-primitive mesh for a rigid part (POSITION and indices only). */
export function addShapeMesh(document: Document, name: string, shape: Shape): Mesh {
  const buffer = getOrCreateBuffer(document);
  const position = document
    .createAccessor(`${name}.position`)
    .setType('VEC3')
    .setArray(Float32Array.from(shape.positions))
    .setBuffer(buffer);
  const indices = document
    .createAccessor(`${name}.indices`)
    .setType('SCALAR')
    .setArray(Uint16Array.from(shape.indices))
    .setBuffer(buffer);
  const primitive = document.createPrimitive().setAttribute('POSITION', position).setIndices(indices);
  return document.createMesh(name).addPrimitive(primitive);
}

function cross(a: Readonly<Vec3>, b: Readonly<Vec3>): Vec3 {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

function normalize3(v: Readonly<Vec3>): Vec3 {
  const n = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / n, v[1] / n, v[2] / n];
}
