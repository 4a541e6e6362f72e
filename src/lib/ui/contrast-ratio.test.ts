import { describe, expect, it } from 'vitest';
import tailwindConfig from '../../../tailwind.config.js';
import { contrastRatio, relativeLuminance } from './contrast-ratio';

type Family = Record<string, string>;
const colors = tailwindConfig.theme?.extend?.colors as Record<string, Family>;

describe('contrastRatio', () => {
  it('gives 21 for black on white, the WCAG maximum', () => {
    // WCAG 2.2 definition of contrast ratio: range 1:1 to 21:1.
    expect(contrastRatio('#000000', '#FFFFFF')).toBeCloseTo(21, 6);
  });

  it('gives 1 for a colour on itself', () => {
    expect(contrastRatio('#3A45B0', '#3a45b0')).toBeCloseTo(1, 9);
  });

  it('is symmetric in its arguments', () => {
    expect(contrastRatio('#1B222C', '#FAFAF7')).toBeCloseTo(contrastRatio('#FAFAF7', '#1B222C'), 9);
  });

  it('matches the familiar 4.48 for #777777 on white, just under AA', () => {
    // Value from memory, widely quoted (#777 on #FFF = 4.48:1); recomputed by hand from the WCAG formula.
    expect(contrastRatio('#777777', '#FFFFFF')).toBeCloseTo(4.48, 2);
  });

  it('rejects anything but #RRGGBB with a message naming the value', () => {
    expect(() => relativeLuminance('teal')).toThrow(/got "teal"/);
  });
});

describe('Orientry palette', () => {
  const white = '#FFFFFF';
  // WCAG 2.2 SC 1.4.3: 4.5:1 for body text. SC 1.4.11: 3:1 for icons and other graphics.
  it.each(['sev-error', 'sev-warning', 'sev-info', 'verdict-pass', 'verdict-fail'])(
    'keeps %s text at AA on its own tint and on white, and its icon at 3:1 or more',
    (family) => {
      const { text, bg, icon } = colors[family];
      expect(contrastRatio(text, bg)).toBeGreaterThanOrEqual(4.5);
      expect(contrastRatio(text, white)).toBeGreaterThanOrEqual(4.5);
      expect(contrastRatio(icon, bg)).toBeGreaterThanOrEqual(3);
      expect(contrastRatio(icon, white)).toBeGreaterThanOrEqual(3);
      // Badge glyphs are white on the icon colour.
      expect(contrastRatio(white, icon)).toBeGreaterThanOrEqual(3);
    }
  );

  it('keeps body, secondary and muted text at AA on paper and on white', () => {
    for (const shade of ['900', '700', '600', '500']) {
      expect(contrastRatio(colors.ink[shade], colors.paper.DEFAULT)).toBeGreaterThanOrEqual(4.5);
      expect(contrastRatio(colors.ink[shade], colors.paper.raised)).toBeGreaterThanOrEqual(4.5);
    }
  });

  it('keeps muted text readable on the table header and zebra tints', () => {
    expect(contrastRatio(colors.ink['600'], colors.ink['50'])).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(colors.ink['500'], colors.ink['50'])).toBeGreaterThanOrEqual(4.5);
  });

  it('keeps links and primary buttons at AA', () => {
    expect(contrastRatio(colors.accent['700'], colors.paper.raised)).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(white, colors.accent['700'])).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(colors.accent['700'], colors.accent['50'])).toBeGreaterThanOrEqual(4.5);
  });

  it('keeps the focus ring at 3:1 against paper', () => {
    expect(contrastRatio(colors.accent['500'], colors.paper.DEFAULT)).toBeGreaterThanOrEqual(3);
  });
});
