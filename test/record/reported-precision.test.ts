/**
 * coordinatePrecision and the decimals of a proposed point: written coordinates keep the precision they
 * were written with (Chapman & Wieczorek 2020, Georeferencing Best Practices, §Uncertainty Related to
 * Coordinate Precision; point-radius.md §5.3: k decimals → 10^-k, to the minute → 1/60°), never more.
 * Darwin Core coordinatePrecision examples (TDWG, dwc terms list): "0.00001", "0.000278 (nearest
 * second)", "0.01667 (nearest minute)", "1.0 (nearest degree)".
 */
import { execFile } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { reportedPrecision } from '../../src/record/reported-precision.ts';

describe('reportedPrecision', () => {
  // input: radius in meters and how the coordinates were written → decimals, coordinatePrecision
  it.each([
    { radius: 14, written: { precisionDegrees: 0.0001, format: 'decimal' }, decimals: 4, coordinatePrecision: '0.0001' }, // "-45.3010": trailing zero written counts
    { radius: 13_603, written: { precisionDegrees: 0.1, format: 'decimal' }, decimals: 1, coordinatePrecision: '0.1' }, // "-45.3"
    { radius: 5_373, written: { precisionDegrees: 0.000001, format: 'decimal' }, decimals: 4, coordinatePrecision: '0.0001' }, // radius coarser than the writing
    { radius: 2_268, written: { precisionDegrees: 1 / 60, format: 'degrees-minutes' }, decimals: 4, coordinatePrecision: '0.0167' }, // nearest minute
    { radius: 50, written: { precisionDegrees: 1 / 3600, format: 'degrees-minutes-seconds' }, decimals: 6, coordinatePrecision: '0.000278' }, // nearest second
    { radius: 4_000, written: undefined, decimals: 4, coordinatePrecision: '0.0001' }, // not written coordinates: from the radius
  ] as const)('$radius m, $written.format $written.precisionDegrees → $decimals decimals, $coordinatePrecision', ({ radius, written, decimals, coordinatePrecision }) => {
    expect(reportedPrecision(radius, written)).toMatchObject({ decimals, coordinatePrecision });
  });
});

describe('whereabouts locate with written decimal coordinates', () => {
  it('writes "-45.3010, -131.2000" back with 4 decimals and coordinatePrecision 0.0001', async () => {
    const root = new URL('../..', import.meta.url).pathname;
    const db = join(mkdtempSync(join(tmpdir(), 'whereabouts-precision-')), 'demo.sqlite');
    const run = (...args: string[]) => promisify(execFile)(process.execPath, [join(root, 'bin/whereabouts.js'), '--db', db, ...args], { cwd: root });
    await run('import', 'gazetteer/demo.geojson', '--source', 'Isla Verdemar demo gazetteer (invented)');
    const body = JSON.parse((await run('locate', '-45.3010, -131.2000', '--geodetic-datum', 'WGS84', '--json')).stdout);
    expect(body.darwinCore).toMatchObject({ decimalLatitude: '-45.3010', decimalLongitude: '-131.2000', coordinatePrecision: '0.0001' });
    expect(body.darwinCore.georeferenceRemarks).toContain('the precision the coordinates were written with (4 decimals)');
  });
});
