/** Road roughness words shared by the server's exports and the client's tables. */

export const ROUGHNESS_SOURCES = ['survey', 'stated', 'driver_report'] as const;
export type RoughnessSource = (typeof ROUGHNESS_SOURCES)[number];

/** How a segment's current roughness was found, in the app's words. */
export const ROUGHNESS_SOURCE_WORDS: Record<RoughnessSource, string> = {
  survey: 'Profile survey',
  stated: 'Stated by hand',
  driver_report: 'Drivers’ reports',
};
