// The map: no tile server. A basemap of country outlines (Natural Earth via world-atlas, converted
// with topojson-client), the gazetteer's own polygons and lines, then the result on top.
// Colours are from the Okabe–Ito palette, which stays distinct for the common colour-vision types.
import { getJson, feature as fetchFeature } from './api.js';
import { basemapFeatures } from './basemap.js';
import { el } from './dom.js';

/* global L */

export const PALETTE = {
  point: '#D55E00', // vermillion
  circle: '#CC79A7', // reddish purple
  featureUsed: '#E69F00', // orange
  candidate: '#009E73', // bluish green
  water: '#0072B2', // blue
  waterFill: '#56B4E9', // sky blue
  record: '#000000',
};

const ADMINISTRATIVE = new Set(['country', 'stateProvince', 'county']);

let basemapData;
let layersData;

/** The basemap and the gazetteer's layers are fetched once and shared by every map on the page. */
async function sharedData() {
  basemapData ??= getJson('/vendor/countries-110m.json').then(basemapFeatures);
  layersData ??= getJson('/api/v1/layers');
  return Promise.all([basemapData, layersData]);
}

function layerStyle(feature) {
  const type = feature.properties.featureType;
  const lineLike = feature.properties.geometryType.includes('LineString');
  if (lineLike) {
    if (type === 'river' || type === 'stream') return { color: PALETTE.water, weight: type === 'river' ? 2 : 1.2, opacity: 0.8 };
    if (type === 'trail') return { color: '#555', weight: 1.2, dashArray: '2 4', opacity: 0.9 };
    return { color: '#555', weight: 1.6, dashArray: '6 3', opacity: 0.9 };
  }
  if (type === 'lake' || type === 'bay') return { color: PALETTE.water, weight: 0.8, fillColor: PALETTE.waterFill, fillOpacity: 0.3 };
  // Units keep an invisible fill so that hovering anywhere inside names the unit under the cursor.
  if (type === 'stateProvince') return { color: '#5c564b', weight: 1.6, dashArray: '8 4', fillOpacity: 0 };
  if (type === 'county') return { color: '#9a9385', weight: 0.8, dashArray: '2 3', fillOpacity: 0 };
  return { color: '#7d7668', weight: 1.2, fillColor: '#efe9dc', fillOpacity: 1 };
}

/** Lower layers first so that lines and small units stay on top of the land. */
function layerOrder(feature) {
  const order = { country: 0, island: 0, stateProvince: 2, county: 3, lake: 1, bay: 1 };
  return feature.properties.geometryType.includes('LineString') ? 5 : (order[feature.properties.featureType] ?? 4);
}

function nameTooltip(text) {
  return el('span', {}, text);
}

/**
 * A name always shown beside its symbol (not only on hover), as a marker of its own so that clearing
 * the result clears it too. The text goes in as a text node, never as markup.
 */
function label(latlng, text, kind) {
  const icon = L.divIcon({ className: `wa-label wa-label-${kind}`, html: el('span', {}, text), iconSize: null, iconAnchor: [-9, 9] });
  return L.marker(latlng, { icon, interactive: false, keyboard: false });
}

/** Gazetteer shapes named on the map itself: land, water and states; counties only on hover (they would crowd it). */
const LABELLED_TYPES = new Set(['island', 'lake', 'bay', 'stateProvince', 'river']);

/** The narrowest view, in meters across, around a candidate when there is no point (common practice, no source) [CHOICE]. */
const CANDIDATE_MIN_VIEW_METERS = 5000;

/** Below this zoom the gazetteer's names are hidden: at island scale they would cover the result [CHOICE]. */
const PLACE_LABEL_MIN_ZOOM = 8;

function formatCoordinate(value, positive, negative, decimals = 5) {
  return `${Math.abs(value).toFixed(decimals)}° ${value >= 0 ? positive : negative}`;
}

/** A control that shows the latitude and longitude under the cursor (WGS84). */
function cursorControl() {
  const control = L.control({ position: 'bottomleft' });
  control.onAdd = (map) => {
    const box = el('div', { class: 'wa-cursor', 'aria-live': 'off' }, 'move the pointer over the map');
    map.on('mousemove', (event) => {
      const { lat, lng } = event.latlng;
      box.textContent = `${formatCoordinate(lat, 'N', 'S')}  ${formatCoordinate(L.Util.wrapNum(lng, [-180, 180], true), 'E', 'W')}`;
    });
    return box;
  };
  return control;
}

function legendControl() {
  const control = L.control({ position: 'topright' });
  const swatch = (className, label) => el('li', {}, el('span', { class: `swatch ${className}`, 'aria-hidden': 'true' }), label);
  control.onAdd = () =>
    el(
      'div',
      { class: 'wa-legend' },
      el('ul', {}, swatch('sw-point', 'proposed point'), swatch('sw-circle', 'uncertainty circle'), swatch('sw-footprint', 'footprint'),
        swatch('sw-feature', 'feature used'), swatch('sw-unit', 'unit the footprint is clipped to'), swatch('sw-candidate', 'other candidate (its number in the list)'), swatch('sw-record', "record's own coordinates")),
    );
  return control;
}

/**
 * A map in `container`. Returns { map, show(result), clear() }; `show` draws a georeference API answer:
 * the feature(s) used, the other candidates, the footprint, the circle and the point.
 */
export async function createMap(container) {
  const map = L.map(container, { worldCopyJump: true, zoomSnap: 0.25, minZoom: 1, maxZoom: 18 });
  map.attributionControl.setPrefix('Leaflet');
  // Short, so that it and the scale bar share the bottom edge of a narrow map (the footer gives the whole credit).
  map.attributionControl.addAttribution('Natural Earth');
  L.control.scale({ metric: true, imperial: false, maxWidth: 120 }).addTo(map);
  cursorControl().addTo(map);
  legendControl().addTo(map);
  map.setView([0, 0], 2);

  const [countries, layers] = await sharedData();
  L.geoJSON(countries, { interactive: false, style: { color: '#b5ad9c', weight: 0.7, fillColor: '#f3efe6', fillOpacity: 1 } }).addTo(map);
  const sorted = [...layers.features].sort((a, b) => layerOrder(a) - layerOrder(b));
  const gazetteer = L.geoJSON({ type: 'FeatureCollection', features: sorted }, {
    style: layerStyle,
    onEachFeature: (f, layer) => {
      if (LABELLED_TYPES.has(f.properties.featureType)) layer.bindTooltip(nameTooltip(f.properties.name), { permanent: true, direction: 'center', className: `wa-place wa-place-${f.properties.featureType}` });
      else layer.bindTooltip(nameTooltip(`${f.properties.name} · ${f.properties.featureType ?? 'feature'}`), { sticky: true, className: 'wa-tip' });
    },
  }).addTo(map);
  const placeLabels = () => container.classList.toggle('wa-places-hidden', map.getZoom() < PLACE_LABEL_MIN_ZOOM);
  map.on('zoomend', placeLabels);
  if (gazetteer.getLayers().length) map.fitBounds(gazetteer.getBounds(), { padding: [10, 10] });
  placeLabels();

  const result = L.featureGroup().addTo(map);

  let shown = 0;

  /** Draws one answer; when answers arrive faster than shapes load, only the latest is drawn. */
  async function show(answer) {
    const generation = ++shown;
    const g = answer.georeference;
    const shapes = await Promise.all((g?.features ?? []).map((f) => fetchFeature(f.sourceId, f.featureId).catch(() => undefined)));
    if (generation !== shown) return;
    result.clearLayers();
    // Each candidate's label carries its number in the candidate list, so two of one name are told apart.
    (answer.candidates ?? []).forEach((c, i) => {
      const used = g?.features?.some((f) => f.sourceId === c.feature.sourceId && f.featureId === c.feature.featureId);
      if (used) return;
      L.circleMarker([c.feature.latitude, c.feature.longitude], { radius: 6, color: '#fff', weight: 1.5, fillColor: PALETTE.candidate, fillOpacity: 1, className: 'wa-candidate' })
        .bindTooltip(nameTooltip(`${c.feature.name} (candidate ${i + 1}, score ${c.score.toFixed(2)})`), { className: 'wa-tip' })
        .addTo(result);
      label([c.feature.latitude, c.feature.longitude], `${i + 1} ${c.feature.name}`, 'candidate').addTo(result);
    });
    const numberOf = (shape) => 1 + (answer.candidates ?? []).findIndex((c) => c.feature.sourceId === shape.properties.sourceId && c.feature.featureId === shape.properties.featureId);
    const usedLabel = (shape) => `${numberOf(shape) ? `${numberOf(shape)} ` : ''}${shape.properties.name} (used)`;
    shapes.forEach((shape, index) => {
      if (!shape) return;
      const name = shape.properties.name;
      if (index > 0 && ADMINISTRATIVE.has(shape.properties.featureType)) {
        // A unit after the feature is the one the footprint was clipped to, not a place the text names.
        L.geoJSON(shape, { style: { color: PALETTE.featureUsed, weight: 2, dashArray: '10 6', fill: false, className: 'wa-unit' } })
          .bindTooltip(nameTooltip(`${name} (${shape.properties.featureType} the footprint is clipped to)`), { className: 'wa-tip', sticky: true }).addTo(result);
      } else if (shape.geometry.type === 'Point') {
        L.circleMarker([shape.properties.latitude, shape.properties.longitude], { radius: 7, color: PALETTE.featureUsed, weight: 3, fill: false, className: 'wa-feature' })
          .bindTooltip(nameTooltip(`${name} (feature used)`), { className: 'wa-tip' }).addTo(result);
        label([shape.properties.latitude, shape.properties.longitude], usedLabel(shape), 'used').addTo(result);
        L.circle([shape.properties.latitude, shape.properties.longitude], { radius: shape.properties.radiusMeters, color: PALETTE.featureUsed, weight: 1.5, dashArray: '3 3', fill: false, interactive: false }).addTo(result);
      } else {
        L.geoJSON(shape, { style: { color: PALETTE.featureUsed, weight: 3, fillColor: PALETTE.featureUsed, fillOpacity: 0.12, className: 'wa-feature' } })
          .bindTooltip(nameTooltip(`${name} (feature used)`), { className: 'wa-tip', sticky: true }).addTo(result);
        label([shape.properties.latitude, shape.properties.longitude], usedLabel(shape), 'used').addTo(result);
      }
    });
    if (!g) {
      delete container.dataset.circleRadius;
      // Each candidate is framed as a point's circle is, its own radius in about the middle third of the
      // view, and never closer than a few kilometres across (common practice, no source): a lone dot at
      // street scale shows nothing to choose by.
      const frame = L.latLngBounds([]);
      for (const c of answer.candidates ?? []) {
        frame.extend(L.latLng(c.feature.latitude, c.feature.longitude).toBounds(Math.max(6 * (c.feature.radiusMeters ?? 0), CANDIDATE_MIN_VIEW_METERS)));
      }
      if (frame.isValid()) map.fitBounds(frame, { maxZoom: 14, animate: false });
      return;
    }
    if (answer.footprint) {
      L.geoJSON(answer.footprint, { interactive: false, style: { color: PALETTE.circle, weight: 1, fillColor: PALETTE.circle, fillOpacity: 0.18, className: 'wa-footprint' } }).addTo(result);
    }
    const radius = Number(answer.darwinCore.coordinateUncertaintyInMeters) || g.uncertaintyMeters;
    const circle = L.circle([g.latitude, g.longitude], { radius, color: PALETTE.circle, weight: 2.5, dashArray: '8 5', fill: false, className: 'wa-circle', interactive: false }).addTo(result);
    L.circleMarker([g.latitude, g.longitude], { radius: 6, color: '#fff', weight: 2, fillColor: PALETTE.point, fillOpacity: 1, className: 'wa-point' })
      .bindTooltip(nameTooltip(`proposed point ${answer.darwinCore.decimalLatitude}, ${answer.darwinCore.decimalLongitude}`), { className: 'wa-tip' })
      .addTo(result);
    container.dataset.circleRadius = String(radius);
    if (answer.recordPoint) {
      L.circleMarker([answer.recordPoint.latitude, answer.recordPoint.longitude], { radius: 5, color: PALETTE.record, weight: 2, fillColor: '#fff', fillOpacity: 1, className: 'wa-record' })
        .bindTooltip(nameTooltip("the record's own coordinates"), { className: 'wa-tip' }).addTo(result);
    }
    // Wide enough to show the surroundings: the circle takes about the middle third of the map.
    map.fitBounds(circle.getBounds().pad(1), { maxZoom: 14, animate: false });
  }

  return { map, show, clear: () => result.clearLayers() };
}
