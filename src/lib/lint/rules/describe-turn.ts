/**
 * Plain words for a quarter or half turn about a principal axis, and what such a turn usually
 * means when it sits on an asset's root: the basis conversion it most likely undoes.
 * Shared by baked-basis and clip-basis-offset so both explain a turn the same way.
 */
import type { PrincipalTurn } from '../math/principal-turn';

/** `−90° about X`. */
export function describeTurn(turn: PrincipalTurn): string {
  const sign = turn.angleDegrees < 0 ? '−' : '';
  return `${sign}${Math.abs(turn.angleDegrees)}° about ${turn.axis}`;
}

/** What a root turn like this usually corrects, in glTF's +Y up, +Z front basis (spec §3.4). */
export function describeTurnCause(turn: PrincipalTurn): string {
  if (turn.axis === 'X' && turn.angleDegrees === -90) {
    return 'the classic Z-up to Y-up conversion, for content authored with +Z up';
  }
  if (turn.axis === 'X' && turn.angleDegrees === 90) {
    return 'a conversion between Y-up and Z-up, turned the opposite way to the usual one';
  }
  if (turn.axis === 'X') return 'an upside-down correction, for content authored with up pointing down';
  if (turn.axis === 'Y' && turn.angleDegrees === 180) {
    return 'a facing correction, for content that faces −Z while glTF assets face +Z';
  }
  if (turn.axis === 'Y') return 'a facing correction, for content that faces ±X while glTF assets face +Z';
  return 'a conversion from a tool whose up or right axis differs from glTF\u2019s';
}
