/**
 * The WCAG 2.x contrast ratio between two `#RRGGBB` colours, from 1 (same) to 21 (black on white).
 * The design sheet shows it beside each palette pair so a changed shade that drops below AA (4.5 for text, 3 for
 * icons and borders) is visible at once. Source: WCAG 2.2, "contrast ratio" and "relative luminance" definitions.
 */
export function contrastRatio(foreground: string, background: string): number {
  const a = relativeLuminance(foreground);
  const b = relativeLuminance(background);
  return (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
}

/** WCAG 2.x relative luminance of a `#RRGGBB` colour, 0 for black to 1 for white. */
export function relativeLuminance(hex: string): number {
  const match = /^#?([0-9a-f]{6})$/i.exec(hex.trim());
  if (!match) throw new TypeError(`relativeLuminance: expected a colour like #1B222C, got "${hex}".`);
  const [r, g, b] = [0, 2, 4].map((offset) => toLinear(parseInt(match[1].slice(offset, offset + 2), 16) / 255));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

function toLinear(channel: number): number {
  // WCAG 2.x uses 0.03928 as the sRGB threshold; the sRGB standard's 0.04045 gives identical results for 8-bit values.
  return channel <= 0.03928 ? channel / 12.92 : ((channel + 0.055) / 1.055) ** 2.4;
}
