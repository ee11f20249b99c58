// Calls to the whereabouts API. Errors come back as JSON {message, field}; they are thrown as
// ApiError so the page can show the message beside the field it names.

export class ApiError extends Error {
  constructor(status, message, field) {
    super(message);
    this.status = status;
    this.field = field;
  }
}

async function call(method, url, body, headers = {}) {
  const response = await fetch(url, { method, body, headers, credentials: 'same-origin' });
  const type = response.headers.get('content-type') ?? '';
  const data = type.includes('application/json') ? await response.json() : await response.text();
  if (!response.ok) {
    const message = typeof data === 'object' && data?.message ? data.message : `${response.status} ${response.statusText}`;
    throw new ApiError(response.status, message, typeof data === 'object' ? data?.field : undefined);
  }
  return data;
}

export const getJson = (url) => call('GET', url);
export const postJson = (url, value) => call('POST', url, JSON.stringify(value), { 'content-type': 'application/json' });
export const putJson = (url, value) => call('PUT', url, JSON.stringify(value), { 'content-type': 'application/json' });
export const postForm = (url, formData) => call('POST', url, formData);

/** The georeference endpoint: the same call for the first lookup and for every edit. */
export const georeference = (request) => postJson('/api/v1/georeference', request);

/** The same answer as a file the server writes (format 'csv' or 'geojson'), as text. */
export const georeferenceFile = (request, format) => postJson(`/api/v1/georeference.${format}`, request);

/** A feature with its geometry, for drawing the feature used. */
export const feature = (sourceId, featureId) => getJson(`/api/v1/features/${encodeURIComponent(sourceId)}/${encodeURIComponent(featureId)}`);
