import { describe, expect, it } from 'vitest';
import { Euler, Quaternion } from 'three';
import { PRINCIPAL_TURNS, findPrincipalTurn } from './principal-turn';

function turnAbout(axis: 'x' | 'y' | 'z', degrees: number): Quaternion {
  // Oracle: three.js Quaternion.setFromEuler with one non-zero angle (right-handed, glTF 2.0 §3.4).
  const radians = (degrees * Math.PI) / 180;
  return new Quaternion().setFromEuler(
    new Euler(axis === 'x' ? radians : 0, axis === 'y' ? radians : 0, axis === 'z' ? radians : 0)
  );
}

describe('PRINCIPAL_TURNS', () => {
  it('holds the nine quarter and half turns about X, Y and Z as three.js builds them', () => {
    expect(PRINCIPAL_TURNS).toHaveLength(9);
    for (const turn of PRINCIPAL_TURNS) {
      const oracle = turnAbout(turn.axis.toLowerCase() as 'x' | 'y' | 'z', turn.angleDegrees);
      const [x, y, z, w] = turn.quaternion;
      // Same rotation: |dot| = 1 (q and −q are one rotation).
      expect(Math.abs(x * oracle.x + y * oracle.y + z * oracle.z + w * oracle.w)).toBeCloseTo(1, 12);
    }
  });
});

describe('findPrincipalTurn', () => {
  it('finds −90° about X, the Z-up to Y-up correction, exactly', () => {
    const q = turnAbout('x', -90);
    const match = findPrincipalTurn(q.x, q.y, q.z, q.w, 0.5);
    expect(match?.turn.axis).toBe('X');
    expect(match?.turn.angleDegrees).toBe(-90);
    expect(match?.deviationDegrees).toBeLessThan(1e-6);
  });

  it('finds a half turn about Y written as −q', () => {
    const q = turnAbout('y', 180);
    const match = findPrincipalTurn(-q.x, -q.y, -q.z, -q.w, 0.5);
    expect(match?.turn).toMatchObject({ axis: 'Y', angleDegrees: 180 });
  });

  it('accepts a turn just inside the tolerance and rejects one just outside', () => {
    // A 90° turn about Z followed by 0.4° about X is 0.4° away from the principal turn.
    const near = turnAbout('z', 90).multiply(turnAbout('x', 0.4));
    expect(findPrincipalTurn(near.x, near.y, near.z, near.w, 0.5)?.deviationDegrees).toBeCloseTo(0.4, 6);
    const far = turnAbout('z', 90).multiply(turnAbout('x', 0.6));
    expect(findPrincipalTurn(far.x, far.y, far.z, far.w, 0.5)).toBeNull();
  });

  it('does not call the identity or a 45° turn a principal turn', () => {
    expect(findPrincipalTurn(0, 0, 0, 1, 0.5)).toBeNull();
    const q = turnAbout('x', 45);
    expect(findPrincipalTurn(q.x, q.y, q.z, q.w, 0.5)).toBeNull();
  });

  it('returns null for a zero or NaN quaternion', () => {
    expect(findPrincipalTurn(0, 0, 0, 0, 0.5)).toBeNull();
    expect(findPrincipalTurn(NaN, 0, 0, 1, 0.5)).toBeNull();
  });
});
