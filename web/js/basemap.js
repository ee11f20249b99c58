// The basemap's country outlines (Natural Earth 1:110m via world-atlas), ready for Leaflet.

/* global topojson */

/**
 * The countries as GeoJSON, with every ring that crosses the antimeridian drawn on one side of it.
 * Natural Earth keeps such a ring (Fiji, Wrangel Island, the far east of Russia) at -180 and +180 at
 * once; drawn as it is, its edge runs across the whole map as a thin band at its latitude. Its western
 * longitudes are moved by +360°, so that it lies from about 170° to 190° (Leaflet draws longitudes past
 * 180°). A ring around a pole (Antarctica) spans every longitude on purpose and is kept as it is.
 * The outlines are only moved whole turns, so not one vertex changes place on the globe.
 * @example basemapFeatures(topo).features.find((f) => f.properties.name === 'Fiji')
 */
export function basemapFeatures(topo) {
  const countries = topojson.feature(topo, topo.objects.countries);
  for (const country of countries.features) {
    const polygons = country.geometry?.type === 'Polygon' ? [country.geometry.coordinates] : (country.geometry?.coordinates ?? []);
    for (const polygon of polygons) for (const ring of polygon) unwrapRing(ring);
  }
  return countries;
}

/** Longitudes spread over more than half the globe mean the ring crosses the antimeridian (or encloses a pole). */
function unwrapRing(ring) {
  const longitudes = ring.map(([lon]) => lon);
  const crosses = Math.max(...longitudes) - Math.min(...longitudes) > 180;
  const aroundPole = ring.some(([, lat]) => Math.abs(lat) > 80);
  if (!crosses || aroundPole) return;
  for (const position of ring) if (position[0] < 0) position[0] += 360;
}
