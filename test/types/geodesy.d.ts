// The part of the registry package geodesy 2.4.0 (C. Veness, MIT) that tests use as a reference.
declare module 'geodesy/latlon-ellipsoidal-vincenty.js' {
  export default class LatLon {
    constructor(latitude: number, longitude: number);
    readonly lat: number;
    readonly lon: number;
    destinationPoint(distance: number, initialBearing: number): LatLon;
    distanceTo(point: LatLon): number;
    initialBearingTo(point: LatLon): number;
  }
}
