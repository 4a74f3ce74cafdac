/** Road roughness words shared by the server's exports and the client's tables. */

export const ROUGHNESS_SOURCES = ['survey', 'stated', 'driver_report'] as const;
export type RoughnessSource = (typeof ROUGHNESS_SOURCES)[number];

/** How a segment's current roughness was found, in the app's words. */
export const ROUGHNESS_SOURCE_WORDS: Record<RoughnessSource, string> = {
  survey: 'Profile survey',
  stated: 'Stated by hand',
  driver_report: 'Drivers’ reports',
};

/**
 * A route segment as the API's segment answers (the list and one segment's detail) describe it:
 * where it lies on its route [m] and its current roughness (IRI [m/km], Gd(n0) [m³], ISO 8608
 * class), with how and when that was found.
 */
export interface SegmentOnRoute {
  id: number;
  routeId: number;
  routeName: string;
  seq: number;
  startM: number;
  endM: number;
  iri: number | null;
  gdN0: number | null;
  isoClass: string | null;
  roughnessSource: RoughnessSource | null;
  roughnessDate: string | null;
}
