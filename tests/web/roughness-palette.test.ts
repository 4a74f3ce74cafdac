import { describe, expect, it } from 'vitest';
import { interpolateViridis } from 'd3-scale-chromatic';
import { BASE_MAP_PAPER, ROUGHNESS_CLASSES, roughnessColours, UNKNOWN_ROUGHNESS_COLOUR } from '../../web/src/lib/roughness';
import { PAPER } from '../../server/tiles/tiles';

/** WCAG 2.1 relative luminance of an sRGB colour "#RRGGBB". */
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.1 contrast ratio, (L1 + 0.05) / (L2 + 0.05) with L1 the lighter. */
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const PAGE_PAPER = '#FAF8F3'; // design.md: page background, behind the legend's swatches

describe('the roughness colour scale', () => {
  it('when the contrast formula is checked, then it gives the known ratios', () => {
    // WCAG 2.1 definition: black on white is 21:1; #767676 on white 4.54:1 (the common-practice
    // lightest grey for body text on white, from memory).
    expect(contrast('#000000', '#FFFFFF')).toBeCloseTo(21, 6);
    expect(contrast('#767676', '#FFFFFF')).toBeCloseTo(4.54, 2);
  });

  it('when drawn on the base map or the page, then every class stands out at least 3:1', () => {
    for (const c of ROUGHNESS_CLASSES) {
      expect(contrast(roughnessColours[c], BASE_MAP_PAPER), `class ${c} on the base map`).toBeGreaterThanOrEqual(3);
      expect(contrast(roughnessColours[c], PAGE_PAPER), `class ${c} on the page`).toBeGreaterThanOrEqual(3);
    }
    expect(contrast(UNKNOWN_ROUGHNESS_COLOUR, BASE_MAP_PAPER)).toBeGreaterThanOrEqual(3);
  });

  it('when the base map colour is read from the tile renderer, then it is the one the scale was checked against', () => {
    const hex = `#${PAPER.map((v) => v.toString(16).padStart(2, '0')).join('')}`.toUpperCase();
    expect(hex).toBe(BASE_MAP_PAPER);
  });

  it('when compared with the reference viridis (d3-scale-chromatic), then each class is the scale at equal steps from 0.52 (A) to 0 (H)', () => {
    ROUGHNESS_CLASSES.forEach((c, i) => {
      expect(roughnessColours[c], `class ${c}`).toBe(interpolateViridis((0.52 * (7 - i)) / 7).toUpperCase());
    });
  });

  it('when read from A to H, then the colours get steadily darker (a sequential scale) and no two neighbours are alike', () => {
    for (let i = 1; i < ROUGHNESS_CLASSES.length; i++) {
      const prev = roughnessColours[ROUGHNESS_CLASSES[i - 1]];
      const next = roughnessColours[ROUGHNESS_CLASSES[i]];
      expect(luminance(next)).toBeLessThan(luminance(prev));
      expect(next).not.toBe(prev);
    }
  });
});
