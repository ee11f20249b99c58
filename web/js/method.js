// The "Method choices" view: every choice the published method leaves open, as GET /api/v1/method lists it.
import { getJson } from './api.js';
import { el, fill } from './dom.js';

/**
 * Fills the table once, the first time the view is opened.
 * @example showMethodChoices(document.getElementById('method-choices'))
 */
export async function showMethodChoices(table) {
  if (table.dataset.loaded === 'true') return;
  const choices = await getJson('/api/v1/method');
  const rows = choices.map((c) =>
    el('tr', { dataset: { choice: c.id, kind: c.kind } },
      el('th', { scope: 'row' }, c.choice, el('div', { class: 'cand-meta' }, c.id)),
      el('td', {}, c.unit ? `${c.value} ${c.unit}` : String(c.value)),
      el('td', {}, c.source),
      el('td', {}, c.changedBy)));
  fill(table.tBodies[0], rows);
  table.dataset.loaded = 'true';
}
