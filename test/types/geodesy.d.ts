// The part of the registry package geodesy 2.4.0 (C. Veness, MIT) that tests use as a reference.
declare module 'geodesy/latlon-ellipsoidal-vincenty.js' {
  export default class LatLon {
    constructor(latitude: number, longitude: number);
    readonly lat: number;
    readonly lon: number;
    destinationPoint(distance: number, initialBearing: number): LatLon;
    distanceTo(point: LatLon): number;
    initialBearingTo(point: LatLon): number;
    /** The point at `fraction` of the geodesic to `point` (Vincenty). */
    intermediatePointTo(point: LatLon, fraction: number): LatLon;
    /** Vincenty's inverse solution, unrounded (distanceTo rounds to 1 mm). */
    inverse(point: LatLon): { distance: number; initialBearing: number; finalBearing: number };
  }
}
declare module 'geodesy/latlon-ellipsoidal-datum.js' {
  export interface Datum { ellipsoid: { a: number; b: number; f: number }; transform: number[] }
  export default class LatLon {
    constructor(lat: number, lon: number, height?: number, datum?: Datum);
    lat: number;
    lon: number;
    static datums: Record<string, Datum>;
    convertDatum(to: Datum): LatLon;
  }
}
declare module 'geodesy/utm.js' {
  import type { Datum } from 'geodesy/latlon-ellipsoidal-datum.js';
  export default class Utm {
    constructor(zone: number, hemisphere: 'N' | 'S', easting: number, northing: number, datum?: Datum);
    toLatLon(): { lat: number; lon: number };
  }
}
