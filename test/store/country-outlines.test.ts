/**
 * A country's outlines, which a store keeps between records once read (the plausibility stage checks
 * every georeferenced record against them), follow the file: an outline imported, replaced or removed
 * through another connection, or through the reading connection itself, is what the next record is
 * checked against, also inside one read transaction (asOfOneMoment). Real SQLite file in WAL mode, two
 * connections as two processes would hold them; the country, its outline and its town invented (QX,
 * user-assigned in ISO 3166-1 §7.1.3, so Natural Earth has no outline of it). The flag checked is the
 * plausibility stage's point outside the record's country outline (src/georef/plausibility.ts).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { locate } from '../../src/locate/locate.ts';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-country-outlines-'));
afterAll(() => rmSync(directory, { recursive: true, force: true }));
const open: GazetteerStore[] = [];
afterEach(() => {
  for (const store of open.splice(0)) store.close();
});

/** Imports one GeoJSON feature as the source `sourceId` (replacing that source when it exists). */
async function importFeature(store: GazetteerStore, sourceId: string, properties: object, geometry: object): Promise<void> {
  const file = join(directory, `${sourceId}.geojson`);
  writeFileSync(file, JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties, geometry }] }));
  await importGazetteer(store, file, { format: 'geojson', citation: `invented ${sourceId}`, sourceId });
}

/** QX's outline as a square of 1.5 degrees whose south-west corner is at `west`, -41. */
const importOutline = (store: GazetteerStore, west: number) => importFeature(store, 'outline',
  { id: `qx-${west}`, name: 'Quixia', featureType: 'country', countryCode: 'QX' },
  { type: 'Polygon', coordinates: [[[west, -41], [west + 1.5, -41], [west + 1.5, -40], [west, -40], [west, -41]]] });

const AROUND_TOWN = -121;
const FAR_WEST = -101;

/** The plausibility flags of the record 'Puerto Quieto' in QX, with the store's outline ids for QX. */
const checked = (store: GazetteerStore) => ({
  flags: locate(store, { locality: 'Puerto Quieto', countryCode: 'QX' }).flags,
  outlines: store.countryOutlines!('QX').map((f) => f.featureId),
});

/** A file with the town and QX's outline around it, written through one connection and read through another, which has checked a record once. */
async function twoConnections(file: string): Promise<{ writer: GazetteerStore; reader: GazetteerStore }> {
  const path = join(directory, file);
  const writer = openGazetteer(path);
  open.push(writer);
  await importFeature(writer, 'towns', { id: 't1', name: 'Puerto Quieto', featureType: 'town', countryCode: 'QX' }, { type: 'Point', coordinates: [-120.25, -40.5] });
  await importOutline(writer, AROUND_TOWN);
  const reader = openGazetteer(path, { readonly: true });
  open.push(reader);
  expect(checked(reader)).toEqual({ flags: [], outlines: ['qx--121'] });
  return { writer, reader };
}

describe('a country\'s outlines kept between records', () => {
  it('checks against an outline replaced and removed through another connection from the next record on', async () => {
    const { writer, reader } = await twoConnections('two-connections.sqlite');
    // Asked again: the kept outline, the same answer.
    expect(checked(reader)).toEqual({ flags: [], outlines: ['qx--121'] });

    await importOutline(writer, FAR_WEST);
    expect(checked(reader)).toEqual({ flags: ['outside-record-country'], outlines: ['qx--101'] });

    writer.removeSource('outline');
    // No outline of QX left, and Natural Earth has none: no country to be outside of.
    expect(checked(reader)).toEqual({ flags: [], outlines: [] });
  });

  it('reads the outline as of the one moment of a read transaction begun after another connection\'s import', async () => {
    const { writer, reader } = await twoConnections('one-moment.sqlite');
    await importOutline(writer, FAR_WEST);
    expect(reader.asOfOneMoment(() => checked(reader))).toEqual({ flags: ['outside-record-country'], outlines: ['qx--101'] });
  });

  it('sees the connection\'s own import and removal, which do not move the file\'s data version for it', async () => {
    const store = openGazetteer(join(directory, 'one-connection.sqlite'));
    open.push(store);
    await importFeature(store, 'towns', { id: 't1', name: 'Puerto Quieto', featureType: 'town', countryCode: 'QX' }, { type: 'Point', coordinates: [-120.25, -40.5] });
    await importOutline(store, AROUND_TOWN);
    expect(checked(store)).toEqual({ flags: [], outlines: ['qx--121'] });
    await importOutline(store, FAR_WEST);
    expect(checked(store)).toEqual({ flags: ['outside-record-country'], outlines: ['qx--101'] });
    store.removeSource('outline');
    expect(checked(store)).toEqual({ flags: [], outlines: [] });
  });
});
