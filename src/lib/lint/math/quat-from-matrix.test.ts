import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Matrix4, Quaternion, Vector3 } from 'three';
import { quatFromMatrix } from './quat-from-matrix';

const unitQuat = fc
  .tuple(
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true }),
    fc.double({ min: -1, max: 1, noNaN: true })
  )
  .filter(([x, y, z, w]) => Math.hypot(x, y, z, w) > 0.1)
  .map(([x, y, z, w]) => new Quaternion(x, y, z, w).normalize());

describe('quatFromMatrix', () => {
  it('recovers the rotation of a column-major TRS matrix (three.js Matrix4.compose as oracle)', () => {
    fc.assert(
      fc.property(
        unitQuat,
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (q, sx, sy) => {
          // glTF 2.0 §3.5.3 stores matrices column-major, as three.js Matrix4.elements does.
          const matrix = new Matrix4().compose(new Vector3(1, -2, 3), q, new Vector3(sx, sy, 2));
          const ours = quatFromMatrix(matrix.elements);
          expect(ours).not.toBeNull();
          const [x, y, z, w] = ours!;
          expect(Math.abs(x * q.x + y * q.y + z * q.z + w * q.w)).toBeCloseTo(1, 9);
        }
      )
    );
  });

  it('returns null for a mirroring matrix (negative determinant, glTF 2.0 §3.7.4)', () => {
    const matrix = new Matrix4().compose(new Vector3(), new Quaternion(), new Vector3(-1, 1, 1));
    expect(quatFromMatrix(matrix.elements)).toBeNull();
  });

  it('returns null for a matrix with a zero-length axis', () => {
    const matrix = new Matrix4().compose(new Vector3(), new Quaternion(), new Vector3(1, 0, 1));
    expect(quatFromMatrix(matrix.elements)).toBeNull();
  });
});
