/**
 * ISO 8608 road roughness classes and their colours: one sequential, colour-vision-safe scale
 * (cividis, Nuñez, Anderton & Renslow 2018, PLoS ONE 13(7) e0199239), light for smooth roads (A)
 * to dark for very rough ones (H). Every chart or map that uses it shows the legend.
 */
export const ROUGHNESS_CLASSES = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H'] as const;
export type RoughnessClass = (typeof ROUGHNESS_CLASSES)[number];

export const roughnessColours: Record<RoughnessClass, string> = {
  A: '#FEE838',
  B: '#D7C659',
  C: '#B2A66D',
  D: '#8D8976',
  E: '#6D6E71',
  F: '#4A546E',
  G: '#263B63',
  H: '#00224E',
};

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
