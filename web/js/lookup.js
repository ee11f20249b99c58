// The lookup view: the form, then how the text was read, the candidates, the edits, the uncertainty
// budget and the Darwin Core fields. Every edit calls the same API again with `options`.
import { georeference, georeferenceFile } from './api.js';
import { copyText, definitionTable, download, el, fill, meters } from './dom.js';

const COMPONENT_LABELS = {
  extent: 'Extent of the feature',
  offset: 'Offset (distance and direction)',
  coordinatePrecision: 'Precision of written coordinates',
  datum: 'Datum',
  mapScale: 'Map scale',
  measurement: 'Measurement error',
};

/** The datum choices: "not stated", then every datum the service converts (GET /api/v1/datums), in its order. */
function datumChoices(datums) {
  return [['', 'not stated (adds the unknown-datum term)'], ...datums.map((d) => [d.epsg, `${d.name} (${d.epsg})`])];
}

const STATUS_WORDS = {
  georeferenced: 'Georeferenced: an estimate to verify',
  ambiguous: 'Ambiguous: choose the feature meant',
  'not-found': 'Not found in the loaded gazetteers',
  unparseable: 'Could not be read',
};

/** The status as a badge; the words carry the meaning, the colour only repeats it. */
export function statusBadge(status) {
  return el('span', { class: `badge status-${status}` }, status);
}

function describeDistance(d) {
  if (!d) return undefined;
  const range = d.range ? ` (range ${d.range.low}–${d.range.high})` : '';
  return `"${d.written}" = ${d.value} ${d.unit}${range}; precision ${d.precision} ${d.unit}, δ ${d.uncertainty} ${d.unit} (${meters(d.uncertaintyMeters)})`;
}

function describeHeading(h) {
  if (!h) return undefined;
  return `"${h.written}" = azimuth ${h.azimuth}°, Δ ±${h.halfWidth}° (${h.kind}${h.toward ? ', toward the feature, reversed' : ''})`;
}

/**
 * Degrees as a person reads them: at most 7 decimals (about 1 cm), so that 32′ shows as 0.5333333, not
 * 0.5333333333333333. Display only: the answer's own numbers are not rounded by it.
 * @example degrees(19.533333333333335) // 19.5333333
 */
function degrees(value) {
  return Number(value.toFixed(7));
}

/** How the text was read: one table, with a row per offset and the assumptions as a list. `idPrefix` keeps the review's ids apart from the lookup's. */
export function interpretationSection(interpretation, idPrefix = '') {
  const chosen = interpretation.chosenClause === null ? undefined : interpretation.clauses[interpretation.chosenClause];
  const rows = [
    ['Locality type', interpretation.type],
    ['Language', interpretation.language],
    ['Clauses', interpretation.clauses.map((c, i) => `${i === interpretation.chosenClause ? '▸ ' : ''}${c.text} [${c.kind}]`).join('  ·  ')],
    ['Clause used', chosen?.text],
    ['Feature named', interpretation.features.join(' · ')],
    ['Approximate ("ca.", "about")', interpretation.approximate ? 'yes (changes neither point nor radius)' : undefined],
  ];
  interpretation.offsets.forEach((o, i) => {
    const n = interpretation.offsets.length > 1 ? ` ${i + 1}` : '';
    rows.push([`Distance${n}`, describeDistance(o.distance)], [`Heading${n}`, describeHeading(o.heading)], [`Path${n}`, o.path ? `${o.path.mode}${o.path.lineName ? ` along ${o.path.lineName}` : ''}` : o.byAir ? 'by air (stated)' : undefined]);
  });
  const c = interpretation.coordinates;
  if (c) rows.push(['Coordinates', `"${c.written}" → ${degrees(c.latitude)}, ${degrees(c.longitude)} (${c.format}, precision ${degrees(c.precisionDegrees)}°${c.datum ? `, datum ${c.datum}` : ''})`], ['Coordinate problems', c.problems.join('; ')]);
  if (interpretation.elevation) rows.push(['Elevation', interpretation.elevation.written]);
  const section = el('section', { class: 'card', 'aria-labelledby': `${idPrefix}h-reading` }, el('h2', { id: `${idPrefix}h-reading` }, 'How the text was read'), definitionTable('Reading of the locality text', rows));
  if (interpretation.notes.length) section.append(el('h3', {}, 'Assumptions and notes'), el('ul', { class: 'notes' }, interpretation.notes.map((n) => el('li', {}, n))));
  return section;
}

function candidateLabel(c, number) {
  const f = c.feature;
  const where = [f.county, f.stateProvince, f.countryCode].filter(Boolean).join(', ');
  return [
    // The number is the one beside the candidate's dot on the map.
    el('span', { class: 'cand-name' }, el('span', { class: 'cand-number' }, String(number)), ' ', f.name),
    el('span', { class: 'cand-meta' }, `${f.featureType ?? 'feature'}${where ? ` · ${where}` : ''} · ${f.sourceId}:${f.featureId}`),
    el('span', { class: 'cand-score' }, `score ${c.score.toFixed(2)} · ${c.why}`),
  ];
}

/** The candidates as a radio group; choosing one asks for the georeference with that feature. */
export function candidatesSection(answer, onChoose, idPrefix = 'cand') {
  const used = answer.georeference?.features ?? [];
  const isUsed = (c) => used.some((f) => f.sourceId === c.feature.sourceId && f.featureId === c.feature.featureId);
  const items = answer.candidates.map((c, i) => {
    const id = `${idPrefix}-${i}`;
    const input = el('input', { type: 'radio', name: `${idPrefix}-choice`, id, value: i, checked: isUsed(c), onchange: () => onChoose(c) });
    return el('li', { class: isUsed(c) ? 'cand used' : 'cand' }, input, el('label', { for: id }, candidateLabel(c, i + 1)));
  });
  // With no georeference the list is a choice still to make, not the feature used.
  const legend = answer.georeference ? 'Feature used for the georeference' : 'None is used yet: choose the feature the text means, if one is';
  return el(
    'section',
    { class: 'card', 'aria-labelledby': `${idPrefix}-h` },
    el('h2', { id: `${idPrefix}-h` }, `Candidates (${answer.candidates.length})`),
    answer.candidates.length
      ? el('fieldset', { class: 'candidates' }, el('legend', {}, legend), el('ul', {}, items))
      : el('p', {}, 'No candidate feature was found.'),
  );
}

/**
 * The uncertainty budget in meters, one row per source of the method, their sum, and what turns the
 * sum into the reported radius: rounding the point to the reported decimals moves it, and that
 * distance is added before the radius is rounded up to whole meters (src/record/darwin-core.ts).
 */
export function budgetSection(answer, idPrefix = '') {
  const components = answer.components ?? {};
  const total = answer.georeference?.uncertaintyMeters ?? Object.values(components).reduce((sum, v) => sum + v, 0);
  const reported = Number(answer.darwinCore.coordinateUncertaintyInMeters);
  const tenths = (value) => value.toFixed(1);
  const rows = Object.entries(COMPONENT_LABELS).map(([key, label]) =>
    el('tr', { class: components[key] ? '' : 'zero' }, el('th', { scope: 'row' }, label), el('td', { class: 'num' }, tenths(components[key] ?? 0))),
  );
  const precision = answer.darwinCore.coordinatePrecision;
  return el(
    'section',
    { class: 'card', 'aria-labelledby': `${idPrefix}h-budget` },
    el('h2', { id: `${idPrefix}h-budget` }, 'Uncertainty budget'),
    el(
      'table',
      { class: 'budget', id: `${idPrefix}budget-table` },
      el('caption', {}, 'Sources of uncertainty in meters (point-radius method, summed)'),
      el('thead', {}, el('tr', {}, el('th', { scope: 'col' }, 'Source'), el('th', { scope: 'col', class: 'num' }, 'Meters'))),
      el('tbody', {}, rows),
      el('tfoot', {},
        el('tr', {}, el('th', { scope: 'row' }, 'Total'), el('td', { class: 'num', id: `${idPrefix}budget-total` }, tenths(total))),
        el('tr', { class: 'rounding' },
          el('th', { scope: 'row' }, `Rounding of the coordinates${precision ? ` to ${precision}°` : ''} adds the distance it moves the point; the radius is then rounded up to whole meters`),
          el('td', { class: 'num', id: `${idPrefix}budget-rounding` }, `+${tenths(reported - total)}`)),
        el('tr', {}, el('th', { scope: 'row' }, 'Reported radius (coordinateUncertaintyInMeters)'), el('td', { class: 'num', id: `${idPrefix}reported-radius` }, answer.darwinCore.coordinateUncertaintyInMeters))),
    ),
  );
}

/** "Polygon, 64 vertices, 114.0 km²": the footprint in words; its WKT is behind the copy and download buttons. */
export function footprintWords(summary) {
  const area = summary.areaSquareMeters >= 1e6 ? `${(summary.areaSquareMeters / 1e6).toFixed(1)} km²` : `${Math.round(summary.areaSquareMeters)} m²`;
  return `${summary.type}${summary.parts > 1 ? ` of ${summary.parts} parts` : ''}, ${summary.vertices} vertices, ${area}`;
}

function footprintCell(answer, copyStatus) {
  const wkt = answer.darwinCore.footprintWKT;
  if (!wkt) return '';
  const words = answer.footprintSummary ? footprintWords(answer.footprintSummary) : `${wkt.length} characters of WKT`;
  return el('span', { class: 'footprint-cell' },
    el('span', { id: 'footprint-summary' }, words), ' ',
    el('button', { type: 'button', class: 'small', id: 'copy-wkt', onclick: () => copyText(wkt, copyStatus) }, 'Copy WKT'), ' ',
    el('button', { type: 'button', class: 'small', id: 'download-wkt', onclick: () => download('footprint.wkt', 'text/plain', `${wkt}\n`) }, 'Download WKT'));
}

/** The Darwin Core fields, ready to copy, and as a CSV row or a GeoJSON feature to download (written by the server). */
export function darwinCoreSection(answer, request) {
  const entries = Object.entries(answer.darwinCore);
  const asText = entries.map(([k, v]) => `${k}\t${v}`).join('\n');
  const copyStatus = el('span', { class: 'copy-status', 'aria-live': 'polite' });
  const shown = entries.map(([k, v]) => [k, k === 'footprintWKT' ? footprintCell(answer, copyStatus) : v]);
  const copyArea = el('textarea', { id: 'dwc-text', readonly: true, rows: 4, class: 'copy-area', 'aria-label': 'Darwin Core fields, tab-separated, ready to copy' }, asText);
  const copy = () => copyText(asText, copyStatus, copyArea);
  const csv = async () => download('georeference.csv', 'text/csv', await georeferenceFile(request, 'csv'));
  const geojson = async () => download('georeference.geojson', 'application/geo+json', await georeferenceFile(request, 'geojson'));
  const georeferenced = answer.status === 'georeferenced';
  return el(
    'section',
    { class: 'card', 'aria-labelledby': 'h-dwc' },
    el('h2', { id: 'h-dwc' }, 'Darwin Core fields'),
    definitionTable('Darwin Core georeference terms for this record', shown, 'pairs dwc'),
    el('details', { class: 'as-text' }, el('summary', {}, 'The fields as tab-separated text'), copyArea),
    el('div', { class: 'actions' },
      el('button', { type: 'button', onclick: copy }, 'Copy fields'), copyStatus,
      el('button', { type: 'button', id: 'download-csv', onclick: csv }, 'Download CSV row'),
      el('button', { type: 'button', id: 'download-geojson', onclick: geojson, disabled: !georeferenced }, 'Download GeoJSON')),
  );
}

/** Distance precision, map scale and datum: each change recomputes through the API. */
export function editsSection(answer, options, datums, onEdit) {
  const distance = answer.interpretation.offsets.find((o) => o.distance)?.distance;
  const precision = el('input', { id: 'e-precision', type: 'number', min: '0', step: 'any', value: options.distancePrecision ?? '', placeholder: distance ? String(distance.precision) : 'no distance given', disabled: !distance });
  const scale = el('input', { id: 'e-scale', type: 'number', min: '1', step: '1', value: options.mapScale ?? '', placeholder: 'e.g. 50000' });
  const datum = el('select', { id: 'e-datum' }, datumChoices(datums).map(([value, label]) => el('option', { value, selected: (options.datum ?? '') === value }, label)));
  const numberOrUndefined = (input) => (input.value === '' ? undefined : Number(input.value));
  const apply = () => onEdit({ distancePrecision: numberOrUndefined(precision), mapScale: numberOrUndefined(scale), datum: datum.value || undefined });
  for (const input of [precision, scale, datum]) input.addEventListener('change', apply);
  return el(
    'section',
    { class: 'card', 'aria-labelledby': 'h-edits' },
    el('h2', { id: 'h-edits' }, 'Edit the reading'),
    el('div', { class: 'grid' },
      el('div', { class: 'field' }, el('label', { for: 'e-precision' }, `Distance precision${distance ? ` (${distance.unit})` : ''}`), precision),
      el('div', { class: 'field' }, el('label', { for: 'e-scale' }, 'Map scale 1 :'), scale),
      el('div', { class: 'field span-all' }, el('label', { for: 'e-datum' }, 'Datum of the coordinates'), datum)),
  );
}

/**
 * The headline: status, point and radius, or the reason none was made, and the record's
 * georeferenceVerificationStatus in words beside it, so that no answer reads as verified.
 * `verificationStatus` is the review's when a reviewer has decided (the batch list gives it).
 * @example summarySection(answer, { verificationStatus: 'verified by data custodian', idPrefix: 'r-' })
 */
export function summarySection(answer, { verificationStatus = answer.darwinCore.georeferenceVerificationStatus, idPrefix = '' } = {}) {
  const d = answer.darwinCore;
  const body = answer.status === 'georeferenced'
    ? el('p', { class: 'headline' },
        el('span', { id: `${idPrefix}result-latitude` }, d.decimalLatitude), ', ', el('span', { id: `${idPrefix}result-longitude` }, d.decimalLongitude),
        ' ± ', el('span', { id: `${idPrefix}result-radius` }, d.coordinateUncertaintyInMeters), ' m (WGS84)')
    : el('p', { class: 'reason', id: `${idPrefix}result-reason` }, answer.reason ?? '');
  const verification = el('p', { class: 'verification' },
    'georeferenceVerificationStatus: ', el('strong', { id: `${idPrefix}result-verification` }, verificationStatus ?? ''),
    answer.status === 'georeferenced'
      ? `. By this reading the place lies within ${d.coordinateUncertaintyInMeters} m of the point${verificationStatus?.startsWith('verified') ? '' : ': check the point, the circle and the feature used'}.`
      : '');
  const extra = answer.recordPoint
    ? el('p', {}, `The record's own coordinates are ${meters(answer.recordPoint.distanceMeters)} from the proposed point, ${answer.recordPoint.withinUncertainty ? 'inside' : 'outside'} the circle.`)
    : undefined;
  return el('section', { class: `card summary s-${answer.status}`, 'aria-labelledby': `${idPrefix}h-summary` },
    el('h2', { id: `${idPrefix}h-summary` }, statusBadge(answer.status), ' ', STATUS_WORDS[answer.status]), body, verification, extra);
}

/** Wires the lookup form to the API, the result panel and the map. */
export function startLookup({ form, output, map, datums }) {
  let request;
  let options = {};

  const fieldOf = (name) => form.elements.namedItem(name);
  const clearErrors = () => {
    form.querySelectorAll('.field-error').forEach((n) => n.remove());
    form.querySelectorAll('[aria-invalid]').forEach((n) => {
      n.removeAttribute('aria-invalid');
      n.removeAttribute('aria-describedby');
    });
  };

  async function run() {
    clearErrors();
    fill(output, el('p', { class: 'working' }, 'Working…'));
    try {
      const answer = await georeference({ ...request, options });
      render(answer);
      await map.show(answer);
    } catch (error) {
      const field = error.field?.split('.').pop();
      const input = field ? fieldOf(field) : null;
      const message = el('p', { class: 'error', role: 'alert' }, error.message);
      if (input instanceof HTMLElement) {
        input.setAttribute('aria-invalid', 'true');
        input.setAttribute('aria-describedby', `${input.id}-error`);
        input.closest('.field')?.append(el('span', { class: 'field-error', id: `${input.id}-error` }, error.message));
      }
      fill(output, message);
    }
  }

  function render(answer) {
    fill(
      output,
      summarySection(answer),
      candidatesSection(answer, (c) => {
        options = { ...options, candidate: { sourceId: c.feature.sourceId, featureId: c.feature.featureId } };
        run();
      }),
      interpretationSection(answer.interpretation),
      editsSection(answer, options, datums, (edits) => {
        options = { ...options, ...edits };
        for (const key of Object.keys(options)) if (options[key] === undefined) delete options[key];
        run();
      }),
      answer.components ? budgetSection(answer) : undefined,
      darwinCoreSection(answer, { ...request, options }),
    );
  }

  form.addEventListener('submit', (event) => {
    event.preventDefault();
    const data = new FormData(form);
    request = {};
    for (const [name, value] of data) if (String(value).trim()) request[name] = String(value).trim();
    request.locality ??= '';
    localStorage.setItem('whereabouts.georeferencedBy', request.georeferencedBy ?? '');
    options = {};
    // A new answer is brought into view (on a phone it starts below the form); an edit's stays where the reader is.
    run().then(() => output.firstElementChild?.scrollIntoView({ block: 'nearest' }));
  });
  fieldOf('georeferencedBy').value = localStorage.getItem('whereabouts.georeferencedBy') ?? '';
}
