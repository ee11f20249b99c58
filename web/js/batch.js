// The batch view: upload (a CSV or a Darwin Core Archive, whose core rows are the records), progress
// (polling), the review list with filters, the downloads the job offers, one record at a time
// with its map, and keyboard shortcuts: a accept, r reject, c next candidate, j/k next/previous.
// Accepting verifies a point, so a record without one is resolved first: another candidate, a
// corrected locality, or the record's own coordinates (the server refuses an accept without a point).
import { getJson, postForm, putJson } from './api.js';
import { definitionTable, el, fill } from './dom.js';
import { budgetSection, candidatesSection, interpretationSection, statusBadge, summarySection } from './lookup.js';

const POLL_MS = 400;

export function startBatch({ form, progress, progressLine, progressText, review, list, recordPanel, map, filters, downloadLinks }) {
  let jobId;
  let records = [];
  let current = -1;
  let detail;
  /** How the reviewer is resolving the current record: { candidate?, locality?, recordCoordinates? }. */
  let resolution = {};

  const reviewer = () => form.elements.namedItem('reviewer').value.trim();
  form.elements.namedItem('reviewer').value = localStorage.getItem('whereabouts.reviewer') ?? '';

  form.addEventListener('submit', async (event) => {
    event.preventDefault();
    localStorage.setItem('whereabouts.reviewer', reviewer());
    const file = form.elements.namedItem('file').files[0];
    if (!file) return void (progressText.textContent = 'choose a CSV file or a Darwin Core Archive first');
    const data = new FormData();
    data.append('file', file);
    const { query, taxa } = generalisation();
    if (taxa) data.append('sensitiveTaxa', taxa);
    progress.value = 0;
    showProgress('working', 'uploading…');
    try {
      ({ jobId } = await postForm(`/api/v1/batches${query}`, data));
      await waitForJob();
    } catch (error) {
      showProgress('failed', `Upload failed: ${error.message}`);
    }
  });

  /** The generalisation asked for in the form: a taxa file and/or a marking column with one way; the server checks them. */
  function generalisation() {
    const field = (name) => form.elements.namedItem(name);
    const taxa = field('sensitiveTaxa').files[0];
    const column = field('sensitiveColumn').value.trim();
    const params = new URLSearchParams();
    if (column) {
      params.set('sensitiveColumn', column);
      const size = field('generaliseSize').value.trim();
      if (size) params.set(field('generaliseBy').value, size);
    }
    return { query: column ? `?${params}` : '', taxa };
  }

  /** The progress line's state is said in words and shown by its style: working, done or failed. */
  function showProgress(state, words) {
    progressLine.dataset.state = state;
    progressText.textContent = words;
    if (state === 'failed') progress.value = 0;
  }

  async function waitForJob() {
    for (;;) {
      const p = await getJson(`/api/v1/batches/${jobId}`);
      progress.value = p.fraction;
      if (p.state === 'done') showProgress('done', `done: ${p.rowsTotal ?? p.rowsDone} rows${p.input === 'darwin-core-archive' ? " of the archive's core" : ''}`);
      else if (p.state === 'failed') showProgress('failed', `Batch failed: ${p.error}`);
      else showProgress('working', `${p.state}… ${Math.round(p.fraction * 100)} %`);
      if (p.state === 'done') return openReview(p.downloads);
      if (p.state === 'failed') return;
      await new Promise((r) => setTimeout(r, POLL_MS));
    }
  }

  /** Opens the review with a link for each download the job offers (the archive only for an archive's job). */
  async function openReview(downloads) {
    review.hidden = false;
    for (const [format, link] of Object.entries(downloadLinks)) {
      link.hidden = !downloads[format];
      link.href = downloads[format] ?? '#';
    }
    map.map.invalidateSize();
    await refreshList(true);
  }

  function filterQuery() {
    const q = new URLSearchParams();
    const add = (key, input) => input.value !== '' && q.set(key, input.value);
    add('status', filters.status);
    add('review', filters.review);
    add('flag', filters.flag);
    add('localityType', filters.localityType);
    add('radiusMin', filters.radiusMin);
    add('radiusMax', filters.radiusMax);
    return q.toString();
  }

  function setOptions(select, values) {
    const keep = select.value;
    fill(select, el('option', { value: '' }, 'any'), values.map((v) => el('option', { value: v, selected: v === keep }, v)));
  }

  let listRequest = 0;
  let recordRequest = 0;
  async function refreshList(first = false) {
    const asked = ++listRequest;
    const answer = await getJson(`/api/v1/batches/${jobId}/records?${filterQuery()}`);
    if (asked !== listRequest) return; // a newer filter has been asked for meanwhile
    setOptions(filters.status, answer.facets.status);
    setOptions(filters.flag, answer.facets.flag);
    setOptions(filters.localityType, answer.facets.localityType);
    const row = records[current]?.row;
    const at = current;
    records = answer.records;
    const tbody = list.tBodies[0];
    fill(tbody, records.map((r, i) =>
      // The whole row opens the record; its button is there for the keyboard (the click bubbles up).
      el('tr', { dataset: { index: i, row: r.row }, class: r.review ? `reviewed ${r.review}` : '', onclick: () => select(i) },
        el('td', { class: 'num' }, el('button', { type: 'button', class: 'link', 'aria-label': `Open row ${r.row}` }, String(r.row))),
        el('td', { class: 'loc' }, r.locality),
        el('td', {}, r.status, r.flags.length ? el('span', { class: 'flag' }, ` ⚑ ${r.flags.join(', ')}`) : ''),
        el('td', { class: 'num' }, r.radiusMeters === null ? '—' : String(r.radiusMeters)),
        el('td', {}, r.review ?? 'not reviewed'))));
    // The record under review stays; one a decision took out of the filter gives its place to the next one, not to the top of the list.
    const keep = records.findIndex((r) => r.row === row);
    if (records.length) await select(first ? 0 : keep >= 0 ? keep : Math.max(0, Math.min(at, records.length - 1)), !first);
    else fill(recordPanel, el('p', {}, 'No record matches these filters.'));
  }

  async function select(index, keepFocus = false) {
    if (index < 0 || index >= records.length) return;
    current = index;
    resolution = {};
    for (const tr of list.tBodies[0].rows) tr.classList.toggle('current', Number(tr.dataset.index) === index);
    list.tBodies[0].rows[index]?.scrollIntoView({ block: 'nearest' });
    const focusBefore = document.activeElement;
    await loadRecord();
    // Not when the person has moved the focus while the record loaded: their keys must go where they put them.
    if (!keepFocus && document.activeElement === focusBefore) recordPanel.focus();
  }

  async function loadRecord() {
    const r = records[current];
    const q = new URLSearchParams();
    if (resolution.candidate) {
      q.set('candidateSource', resolution.candidate.sourceId);
      q.set('candidateFeature', resolution.candidate.featureId);
    }
    if (resolution.locality !== undefined) q.set('locality', resolution.locality);
    if (resolution.recordCoordinates) q.set('recordCoordinates', 'true');
    const asked = ++recordRequest;
    let answer;
    try {
      answer = await getJson(`/api/v1/batches/${jobId}/records/${r.row}${q.size ? `?${q}` : ''}`);
    } catch (error) {
      return say(error.message);
    }
    if (asked !== recordRequest) return; // keys pressed quickly: only the newest record is shown
    detail = answer;
    renderRecord();
    await map.show(detail.answer);
  }

  /** A message about the current record (a refused decision, a resolution that did not work). */
  function say(message) {
    recordPanel.querySelector('#review-message')?.replaceChildren(message);
  }

  /** The three ways to give a record a point; the candidates are in their own section. */
  function resolveSection() {
    const a = detail.answer;
    const { decimalLatitude: lat = '', decimalLongitude: lon = '' } = detail.original;
    const hasOwn = lat.trim() !== '' && lon.trim() !== '';
    const correction = detail.flags.find((f) => f.startsWith('fits-if-'));
    const text = el('input', { id: 'resolve-locality', type: 'text', maxlength: '4000', value: resolution.locality ?? records[current].locality });
    const correct = el('form', { class: 'resolve-locality', onsubmit: (event) => {
      event.preventDefault();
      if (text.value.trim()) resolveWith({ locality: text.value.trim() });
    } },
      el('label', { for: 'resolve-locality' }, 'Corrected locality text'),
      el('div', { class: 'inline' }, text, el('button', { type: 'submit', id: 'resolve-locality-submit' }, 'Georeference this text')));
    const unusable = detail.flags.find((f) => UNUSABLE_OWN_COORDINATES.has(f));
    const own = hasOwn && unusable
      ? el('p', { class: 'hint', id: 'own-coordinates-unusable' }, `The record's own coordinates (${lat}, ${lon}) cannot serve as the point: the coordinate check says ${unusable}.`)
      : hasOwn
      ? el('div', { class: 'inline' },
          el('button', { type: 'button', id: 'use-record-coordinates', onclick: () => resolveWith({ recordCoordinates: true }) }, `Use the record's own coordinates (${lat}, ${lon})`),
          correction ? el('span', { class: 'hint' }, `corrected as the coordinate check found: ${correction}`) : undefined)
      : el('p', { class: 'hint' }, 'The record has no coordinates of its own.');
    const parts = [
      el('p', { class: 'hint' }, a.candidates.length ? 'Choose a candidate below, correct the locality text, or use the record\'s own coordinates.' : 'Correct the locality text, or use the record\'s own coordinates.'),
      correct, own,
      detail.resolutionNote ? el('p', { class: 'resolution-note', id: 'resolution-note' }, detail.resolutionNote) : undefined,
      Object.keys(resolution).length ? el('button', { type: 'button', id: 'resolve-reset', onclick: () => resolveWith({}) }, "Back to the batch's proposal") : undefined,
    ];
    if (!a.georeference) return el('section', { class: 'card resolve needed', 'aria-labelledby': 'h-resolve' }, el('h2', { id: 'h-resolve' }, 'Give this record a point before accepting it'), parts);
    // With a point already, the corrections stay folded unless one is in use or the coordinate check suggests one.
    const open = Object.keys(resolution).length > 0 || Boolean(correction);
    return el('details', { class: 'card resolve', open }, el('summary', { id: 'h-resolve' }, 'Correct the point'), parts);
  }

  function resolveWith(next) {
    resolution = next;
    return loadRecord();
  }

  function renderRecord() {
    const a = detail.answer;
    const reviewLine = detail.review
      ? el('p', { class: 'review-line' }, statusBadge(detail.review.decision), ` by ${detail.review.reviewer} at ${detail.review.decidedAt}`)
      : el('p', { class: 'review-line' }, 'not reviewed yet');
    const hasPoint = Boolean(a.georeference);
    fill(
      recordPanel,
      el('h2', {}, `Row ${detail.row} of the batch`),
      reviewLine,
      el('div', { class: 'actions decision' },
        el('button', { type: 'button', id: 'accept', class: 'primary', onclick: accept, disabled: !hasPoint, title: hasPoint ? undefined : NO_POINT_TO_ACCEPT, 'aria-keyshortcuts': 'a' }, 'Accept (a)'),
        el('button', { type: 'button', id: 'reject', onclick: () => decide('rejected'), 'aria-keyshortcuts': 'r' }, 'Reject (r)'),
        el('button', { type: 'button', id: 'next-candidate', onclick: nextCandidate, disabled: a.candidates.length < 2, 'aria-keyshortcuts': 'c' }, 'Next candidate (c)'),
        el('button', { type: 'button', onclick: () => select(current + 1), 'aria-keyshortcuts': 'j' }, 'Next record (j)')),
      el('p', { id: 'review-message', class: 'error', role: 'alert' }),
      summarySection(a, { verificationStatus: records[current].status, idPrefix: 'r-' }),
      resolveSection(),
      definitionTable('The record as it came', Object.entries(detail.original)),
      candidatesSection(a, (c) => chooseCandidate(c.feature), 'rcand'),
      interpretationSection(a.interpretation, 'r-'),
      a.components ? budgetSection(a, 'r-') : undefined,
    );
  }

  // A candidate of a corrected locality keeps the correction.
  function chooseCandidate(feature) {
    return resolveWith({ ...(resolution.locality !== undefined ? { locality: resolution.locality } : {}), candidate: { sourceId: feature.sourceId, featureId: feature.featureId } });
  }

  function nextCandidate() {
    const candidates = detail.answer.candidates;
    if (candidates.length < 2) return;
    const used = detail.answer.georeference?.features?.[0];
    const at = candidates.findIndex((c) => c.feature.sourceId === used?.sourceId && c.feature.featureId === used?.featureId);
    return chooseCandidate(candidates[(at + 1) % candidates.length].feature);
  }

  /** The accept key does what the accept button does: without a point it is disabled, so nothing is sent and its title is said. */
  function accept() {
    if (!detail.answer.georeference) return say(NO_POINT_TO_ACCEPT);
    return decide('accepted');
  }

  async function decide(decision) {
    const r = records[current];
    if (!r) return;
    try {
      await putJson(`/api/v1/batches/${jobId}/records/${r.row}/review`, { decision, reviewer: reviewer(), ...resolution });
    } catch (error) {
      return say(error.message);
    }
    await refreshList();
  }

  for (const input of Object.values(filters)) input.addEventListener('change', () => refreshList(true));

  // The review keys work wherever the focus is on the page, except while typing in a text field.
  document.addEventListener('keydown', (event) => {
    if (review.hidden || review.closest('.view')?.hidden || !detail || isTyping(event.target) || event.altKey || event.ctrlKey || event.metaKey) return;
    const actions = { a: accept, r: () => decide('rejected'), c: nextCandidate, j: () => select(current + 1), k: () => select(current - 1) };
    const action = actions[event.key];
    if (action) {
      event.preventDefault();
      action();
    }
  });
}

/** Why the accept button is disabled on a record without a point; the accept key says it too. */
const NO_POINT_TO_ACCEPT = 'Nothing to accept: no point to verify yet. Give this record a point first.';

/** Coordinate-check flags under which a record's own coordinates are no point to verify (src/batch/coordinate-check.ts). */
const UNUSABLE_OWN_COORDINATES = new Set(['beyond-valid-range', 'not-a-decimal-number', 'one-side-empty', 'both-zero']);

const NOT_TYPED = new Set(['button', 'checkbox', 'radio', 'submit', 'reset', 'file', 'range', 'color', 'image']);

/** True when keys go into a text: a text input, a text area, a list box, or editable content. */
function isTyping(target) {
  if (!(target instanceof HTMLElement)) return false;
  if (target instanceof HTMLInputElement) return !NOT_TYPED.has(target.type);
  return target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement || target.isContentEditable;
}
