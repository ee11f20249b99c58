// The batch view: upload, progress (polling), the review list with filters, one record at a time
// with its map, and keyboard shortcuts: a accept, r reject, c next candidate, j/k next/previous.
import { getJson, postForm, putJson } from './api.js';
import { definitionTable, el, fill } from './dom.js';
import { budgetSection, candidatesSection, interpretationSection, statusBadge, summarySection } from './lookup.js';

const POLL_MS = 400;

export function startBatch({ form, progress, progressText, review, list, recordPanel, map, filters, downloadLink, gisLinks }) {
  let jobId;
  let records = [];
  let current = -1;
  let detail;
  let candidateChoice;

  const reviewer = () => form.elements.namedItem('reviewer').value.trim();
  form.elements.namedItem('reviewer').value = localStorage.getItem('whereabouts.reviewer') ?? '';

  form.addEventListener('submit', async (event) => {
    event.preventDefault();
    localStorage.setItem('whereabouts.reviewer', reviewer());
    const file = form.elements.namedItem('file').files[0];
    if (!file) return void (progressText.textContent = 'choose a CSV file first');
    const data = new FormData();
    data.append('file', file);
    progress.value = 0;
    progressText.textContent = 'uploading…';
    try {
      ({ jobId } = await postForm('/api/v1/batches', data));
      await waitForJob();
    } catch (error) {
      progressText.textContent = `upload failed: ${error.message}`;
    }
  });

  async function waitForJob() {
    for (;;) {
      const p = await getJson(`/api/v1/batches/${jobId}`);
      progress.value = p.fraction;
      progressText.textContent = p.state === 'done' ? `done: ${p.rowsTotal ?? p.rowsDone} rows` : p.state === 'failed' ? `failed: ${p.error}` : `${p.state}… ${Math.round(p.fraction * 100)} %`;
      if (p.state === 'done') return openReview();
      if (p.state === 'failed') return;
      await new Promise((r) => setTimeout(r, POLL_MS));
    }
  }

  async function openReview() {
    review.hidden = false;
    downloadLink.href = `/api/v1/batches/${jobId}/reviewed.csv`;
    for (const [format, link] of Object.entries(gisLinks)) link.href = `/api/v1/batches/${jobId}/reviewed.${format}`;
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
  async function refreshList(first = false) {
    const asked = ++listRequest;
    const answer = await getJson(`/api/v1/batches/${jobId}/records?${filterQuery()}`);
    if (asked !== listRequest) return; // a newer filter has been asked for meanwhile
    setOptions(filters.status, answer.facets.status);
    setOptions(filters.flag, answer.facets.flag);
    setOptions(filters.localityType, answer.facets.localityType);
    const row = records[current]?.row;
    records = answer.records;
    const tbody = list.tBodies[0];
    fill(tbody, records.map((r, i) =>
      el('tr', { dataset: { index: i }, class: r.review ? `reviewed ${r.review}` : '' },
        el('td', { class: 'num' }, el('button', { type: 'button', class: 'link', onclick: () => select(i), 'aria-label': `Open row ${r.row}` }, String(r.row))),
        el('td', { class: 'loc' }, r.locality),
        el('td', {}, r.status, r.flags.length ? el('span', { class: 'flag' }, ` ⚑ ${r.flags.join(', ')}`) : ''),
        el('td', { class: 'num' }, r.radiusMeters === null ? '—' : r.radiusMeters.toLocaleString('en-GB')),
        el('td', {}, r.review ?? 'not reviewed'))));
    const keep = records.findIndex((r) => r.row === row);
    if (records.length) await select(first || keep < 0 ? 0 : keep, !first);
    else fill(recordPanel, el('p', {}, 'No record matches these filters.'));
  }

  async function select(index, keepFocus = false) {
    if (index < 0 || index >= records.length) return;
    current = index;
    candidateChoice = undefined;
    for (const tr of list.tBodies[0].rows) tr.classList.toggle('current', Number(tr.dataset.index) === index);
    list.tBodies[0].rows[index]?.scrollIntoView({ block: 'nearest' });
    await loadRecord();
    if (!keepFocus) recordPanel.focus();
  }

  async function loadRecord() {
    const r = records[current];
    const q = candidateChoice ? `?candidateSource=${encodeURIComponent(candidateChoice.sourceId)}&candidateFeature=${encodeURIComponent(candidateChoice.featureId)}` : '';
    detail = await getJson(`/api/v1/batches/${jobId}/records/${r.row}${q}`);
    renderRecord();
    await map.show(detail.answer);
  }

  function renderRecord() {
    const a = detail.answer;
    const reviewLine = detail.review
      ? el('p', { class: 'review-line' }, statusBadge(detail.review.decision), ` by ${detail.review.reviewer} at ${detail.review.decidedAt}`)
      : el('p', { class: 'review-line' }, 'not reviewed yet');
    fill(
      recordPanel,
      el('h2', {}, `Row ${detail.row} of the batch`),
      reviewLine,
      el('div', { class: 'actions decision' },
        el('button', { type: 'button', id: 'accept', class: 'primary', onclick: () => decide('accepted'), 'aria-keyshortcuts': 'a' }, 'Accept (a)'),
        el('button', { type: 'button', id: 'reject', onclick: () => decide('rejected'), 'aria-keyshortcuts': 'r' }, 'Reject (r)'),
        el('button', { type: 'button', id: 'next-candidate', onclick: nextCandidate, disabled: a.candidates.length < 2, 'aria-keyshortcuts': 'c' }, 'Next candidate (c)'),
        el('button', { type: 'button', onclick: () => select(current + 1), 'aria-keyshortcuts': 'j' }, 'Next record (j)')),
      definitionTable('The record as it came', Object.entries(detail.original)),
      summarySection(a),
      candidatesSection(a, (c) => chooseCandidate(c.feature), 'rcand'),
      interpretationSection(a.interpretation),
      a.components ? budgetSection(a) : undefined,
    );
  }

  function chooseCandidate(feature) {
    candidateChoice = { sourceId: feature.sourceId, featureId: feature.featureId };
    return loadRecord();
  }

  function nextCandidate() {
    const candidates = detail.answer.candidates;
    if (candidates.length < 2) return;
    const used = detail.answer.georeference?.features?.[0];
    const at = candidates.findIndex((c) => c.feature.sourceId === used?.sourceId && c.feature.featureId === used?.featureId);
    return chooseCandidate(candidates[(at + 1) % candidates.length].feature);
  }

  async function decide(decision) {
    const r = records[current];
    const body = { decision, reviewer: reviewer() };
    if (candidateChoice) body.candidate = candidateChoice;
    await putJson(`/api/v1/batches/${jobId}/records/${r.row}/review`, body);
    await refreshList();
  }

  for (const input of Object.values(filters)) input.addEventListener('change', () => refreshList(true));

  recordPanel.addEventListener('keydown', (event) => {
    if (event.target instanceof HTMLInputElement || event.target instanceof HTMLSelectElement || event.altKey || event.ctrlKey || event.metaKey) return;
    const actions = { a: () => decide('accepted'), r: () => decide('rejected'), c: nextCandidate, j: () => select(current + 1), k: () => select(current - 1) };
    const action = actions[event.key];
    if (action) {
      event.preventDefault();
      action();
    }
  });
}
