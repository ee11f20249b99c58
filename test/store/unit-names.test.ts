/**
 * A level's unit names, which a store keeps between lookups once read (a stated unit the gazetteer does not
 * know reads them all), follow the file: a source with unit names imported or removed through another
 * connection, or through the reading connection itself, is seen on the next lookup, also inside one read
 * transaction (asOfOneMoment). Real SQLite file in WAL mode, two connections as two processes would hold
 * them; places and units invented (country QX, user-assigned in ISO 3166-1 §7.1.3). The stated-unit
 * reading checked is statedUnitReadings' "one of the names the unit joins" (src/match/context.ts).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { readStatedState } from '../../src/locate/administrative-unit.ts';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-unit-names-'));
afterAll(() => rmSync(directory, { recursive: true, force: true }));
const open: GazetteerStore[] = [];
afterEach(() => {
  for (const store of open.splice(0)) store.close();
});

/** A dump-layout source of one town in the QX admin1 unit `code`, named `unit` by the admin1 file. */
async function importUnit(store: GazetteerStore, sourceId: string, code: string, unit: string, town: string): Promise<void> {
  const dump = join(directory, `${sourceId}.txt`);
  const codes = join(directory, `${sourceId}-admin1.txt`);
  writeFileSync(dump, `1\t${town}\t${town}\t\t-20.5\t-60.25\tP\tPPL\tQX\t\t${code}\t\t\t\t0\t\t\t\t2026-01-01\n`);
  writeFileSync(codes, `QX.${code}\t${unit}\t${unit}\t0\n`);
  await importGazetteer(store, dump, { format: 'geonames', citation: `invented ${sourceId}`, sourceId, adminCodesFile: codes });
}

const unitKeys = (store: GazetteerStore) => store.unitNames(1).map((name) => name.unitKey).sort();

/** A file with the unit Costa Alta, written through one connection and read through another, which has read its units once. */
async function twoConnections(file: string): Promise<{ writer: GazetteerStore; reader: GazetteerStore }> {
  const path = join(directory, file);
  const writer = openGazetteer(path);
  open.push(writer);
  await importUnit(writer, 'north', '01', 'Costa Alta', 'Puerto Quieto');
  const reader = openGazetteer(path, { readonly: true });
  open.push(reader);
  expect(unitKeys(reader)).toEqual(['costa alta']);
  return { writer, reader };
}

describe('a level\'s unit names kept between lookups', () => {
  it('sees a source imported and removed through another connection on its next lookup', async () => {
    const { writer, reader } = await twoConnections('two-connections.sqlite');
    // Asked again: the kept names, the same answer.
    expect(unitKeys(reader)).toEqual(['costa alta']);
    expect(readStatedState(reader, { countryCode: 'QX', stateProvince: 'Sierra Baja' }).note).toBeUndefined();

    await importUnit(writer, 'south', '02', 'Sierra Baja y Llanos', 'Vado Seco');
    expect(unitKeys(reader)).toEqual(['costa alta', 'sierra baja y llanos']);
    const read = readStatedState(reader, { countryCode: 'QX', stateProvince: 'Sierra Baja' });
    expect(read.context.stateProvince).toBe('sierra baja y llanos');
    expect(read.note).toMatch(/read as the loaded unit "sierra baja y llanos" \(one of the names the unit joins\)/);

    writer.removeSource('south');
    expect(unitKeys(reader)).toEqual(['costa alta']);
  });

  it('reads the names as of the one moment of a read transaction begun after another connection\'s import', async () => {
    const { writer, reader } = await twoConnections('one-moment.sqlite');
    await importUnit(writer, 'south', '02', 'Sierra Baja y Llanos', 'Vado Seco');
    expect(reader.asOfOneMoment(() => [reader.sources().map((source) => source.id), unitKeys(reader)])).toEqual([
      ['north', 'south'], ['costa alta', 'sierra baja y llanos'],
    ]);
  });

  it('sees the connection\'s own import and removal, which do not move the file\'s data version for it', async () => {
    const store = openGazetteer(join(directory, 'one-connection.sqlite'));
    open.push(store);
    await importUnit(store, 'north', '01', 'Costa Alta', 'Puerto Quieto');
    expect(unitKeys(store)).toEqual(['costa alta']);
    await importUnit(store, 'south', '02', 'Sierra Baja y Llanos', 'Vado Seco');
    expect(unitKeys(store)).toEqual(['costa alta', 'sierra baja y llanos']);
    store.removeSource('north');
    expect(unitKeys(store)).toEqual(['sierra baja y llanos']);
  });
});
