// The page's entry: three views (lookup and batch review, each with its own map; the method's choices).
import { getJson } from './api.js';
import { startBatch } from './batch.js';
import { el, fill } from './dom.js';
import { startLookup } from './lookup.js';
import { createMap } from './map.js';
import { showMethodChoices } from './method.js';

const $ = (id) => document.getElementById(id);

function showView(name) {
  for (const view of ['lookup', 'batch', 'method']) {
    $(`view-${view}`).hidden = view !== name;
    $(`tab-${view}`).setAttribute('aria-pressed', String(view === name));
  }
  maps[name]?.map.invalidateSize();
}

const maps = {};

async function start() {
  $('tab-lookup').addEventListener('click', () => showView('lookup'));
  $('tab-batch').addEventListener('click', () => showView('batch'));
  $('tab-method').addEventListener('click', () => {
    showView('method');
    showMethodChoices($('method-choices')).catch((error) => fill($('method-choices').tBodies[0], el('tr', {}, el('td', { colspan: 4, class: 'error' }, `The choices could not be loaded: ${error.message}`))));
  });
  maps.lookup = await createMap($('lookup-map'));
  const { datums } = await getJson('/api/v1/datums');
  startLookup({ form: $('lookup-form'), output: $('lookup-result'), map: maps.lookup, datums });
  // The review map is created while its view is hidden; it is resized when the review opens.
  maps.batch = await createMap($('review-map'));
  startBatch({
    form: $('batch-form'),
    progress: $('batch-progress'),
    progressLine: $('batch-progress-line'),
    progressText: $('batch-progress-text'),
    review: $('batch-review'),
    list: $('review-list'),
    recordPanel: $('review-record'),
    map: maps.batch,
    downloadLinks: { csv: $('batch-download'), geojson: $('batch-download-geojson'), gpkg: $('batch-download-gpkg'), zip: $('batch-download-zip') },
    filters: { status: $('r-status'), review: $('r-review'), flag: $('r-flag'), localityType: $('r-type'), radiusMin: $('r-radius-min'), radiusMax: $('r-radius-max') },
  });
  document.body.dataset.ready = 'true';
}

start().catch((error) => {
  document.body.dataset.ready = 'error';
  $('lookup-result').textContent = `The page could not start: ${error.message}`;
});
