import { describe, expect, it } from 'vitest';
import tailwindConfig from '../../../tailwind.config.js';
import { CHART_COLORS } from './chart-colors';

type Shades = Record<string, string | Record<string, string>>;
const colors = tailwindConfig.theme?.extend?.colors as Record<string, Shades>;

describe('CHART_COLORS', () => {
  it.each([
    { name: 'line', family: 'ink', shade: '600' },
    { name: 'grid', family: 'ink', shade: '100' },
    { name: 'tick', family: 'ink', shade: '500' },
    { name: 'latest', family: 'accent', shade: '700' },
    { name: 'error', family: 'sev-error', shade: 'icon' },
    { name: 'warning', family: 'sev-warning', shade: 'icon' },
    { name: 'info', family: 'sev-info', shade: 'icon' },
    { name: 'pass', family: 'verdict-pass', shade: 'icon' },
    { name: 'fail', family: 'verdict-fail', shade: 'icon' }
  ] as const)('keeps $name equal to $family-$shade in the Tailwind palette', ({ name, family, shade }) => {
    expect(CHART_COLORS[name].toUpperCase()).toBe(String(colors[family][shade]).toUpperCase());
  });

  it('derives the line fill from the line colour', () => {
    const [r, g, b] = [1, 3, 5].map((offset) => parseInt(CHART_COLORS.line.slice(offset, offset + 2), 16));
    expect(CHART_COLORS.lineFill).toBe(`rgba(${r}, ${g}, ${b}, 0.07)`);
  });
});
