/**
 * ISO 8608 road roughness classes and their colours: one sequential, perceptually uniform,
 * colour-vision-safe scale (viridis, van der Walt & Smith for matplotlib 2015), from blue-green for
 * smooth roads (A) to deep violet for very rough ones (H). Only the darker part of the scale is
 * used (t = 0.52 for A down to 0 for H, in equal steps) so that every class stands out at least
 * 3:1 against the light base map (WCAG 2.1 non-text contrast); the light yellow end would vanish
 * on it. A segment without a known class is drawn dashed in a warm grey, a hue the scale does not
 * use. Every chart or map that uses the scale shows the legend. Method: docs/methods.md,
 * "Roughness colours".
 */
export const ROUGHNESS_CLASSES = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'] as const;
export type RoughnessClass = (typeof ROUGHNESS_CLASSES)[number];

export const roughnessColours: Record<RoughnessClass, string> = {
  A: '#1F958B',
  B: '#25838E',
  C: '#2C718E',
  D: '#355F8D',
  E: '#3E4A89',
  F: '#463480',
  G: '#481C6E',
  H: '#440154',
};

/** Where the class is not known (no survey, no stated value, no accepted report): drawn dashed. */
export const UNKNOWN_ROUGHNESS_COLOUR = '#7D7064';

/** The offline base map's paper colour (server/tiles/tiles.ts draws it); lines must stand out on it. */
export const BASE_MAP_PAPER = '#F3F0E8';

/** The outline drawn under every road line, so a line reads against the base and its neighbours. */
export const ROAD_OUTLINE_COLOUR = '#FFFFFF';

/** Plain words for each class, as fleet people would say them. */
export const roughnessWords: Record<RoughnessClass, string> = {
  A: 'very smooth',
  B: 'smooth',
  C: 'average',
  D: 'poor',
  E: 'very poor',
  F: 'rough',
  G: 'very rough',
  H: 'extremely rough',
};

export function isRoughnessClass(value: unknown): value is RoughnessClass {
  return typeof value === 'string' && (ROUGHNESS_CLASSES as readonly string[]).includes(value);
}
