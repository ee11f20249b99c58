/**
 * The holder's list of sensitive taxa and the marking column: inputs and the rows they pick, side by side.
 * Folding (case and white space) is our documented rule (README, "Sensitive localities generalised on request").
 */
import { describe, expect, it } from 'vitest';
import { foldTaxonName, readSensitiveTaxa, sensitiveGeneralisation } from '../../src/batch/sensitive-records.ts';

describe('sensitive taxa list', () => {
  it('reads names folded and grids in degrees (the list as it was first written)', () => {
    expect(readSensitiveTaxa('\uFEFFscientificName,gridDegrees\n" Verdemaria  LINDOENSIS ",0.1\nTelmoa ambigua,0.01\n')).toEqual({ 'verdemaria lindoensis': { gridDegrees: 0.1 }, 'telmoa ambigua': { gridDegrees: 0.01 } });
    expect(foldTaxonName('Telmoa\tAmbigua')).toBe('telmoa ambigua');
  });

  it('reads a grid in meters or a stated distance from their own columns, one a taxon', () => {
    const text = 'scientificName,gridDegrees,gridMeters,distanceMeters\nVerdemaria lindoensis,0.1,,\nTelmoa ambigua,,1000,\nSerenella alticola,,,5000\n';
    expect(readSensitiveTaxa(text)).toEqual({ 'verdemaria lindoensis': { gridDegrees: 0.1 }, 'telmoa ambigua': { gridMeters: 1000 }, 'serenella alticola': { distanceMeters: 5000 } });
    expect(readSensitiveTaxa('scientificName,distanceMeters\nTelmoa ambigua,2000\n')).toEqual({ 'telmoa ambigua': { distanceMeters: 2000 } });
  });

  it('names the line of a bad grid, of two ways for one taxon, of a missing name, and a header without the columns', () => {
    expect(() => readSensitiveTaxa('scientificName,gridDegrees\nTelmoa ambigua,0\n', 'taxa.csv')).toThrow(/taxa\.csv, line 2 \(Telmoa ambigua\): a generalisation grid/);
    expect(() => readSensitiveTaxa('scientificName,gridDegrees,gridMeters\nTelmoa ambigua,0.1,1000\n', 'taxa.csv')).toThrow(/taxa\.csv, line 2 \(Telmoa ambigua\): give exactly one of .* not gridDegrees and gridMeters/);
    expect(() => readSensitiveTaxa('scientificName,gridMeters\nTelmoa ambigua,2 km\n', 'taxa.csv')).toThrow(/line 2 .*grid in meters must be a number of meters/);
    expect(() => readSensitiveTaxa('scientificName,gridDegrees\n,0.1\n', 'taxa.csv')).toThrow(/taxa\.csv, line 2: no scientificName/);
    expect(() => readSensitiveTaxa('name,gridKm\nTelmoa ambigua,1\n')).toThrow(/needs the column scientificName and at least one of gridDegrees, gridMeters, distanceMeters/);
  });
});

describe('rows picked', () => {
  const header = ['scientificName', 'locality', 'withhold'];
  const pick = sensitiveGeneralisation(header, { taxa: { 'telmoa ambigua': { gridDegrees: 0.01 }, 'serenella alticola': { gridMeters: 20000 } }, column: 'withhold', gridDegrees: 0.1 });
  const cases: [string[], unknown][] = [
    [['Telmoa  ambigua', 'x', ''], { gridDegrees: 0.01 }],
    [['Aubracia marina', 'x', 'yes'], { gridDegrees: 0.1 }],
    [['Telmoa ambigua', 'x', '1'], { gridDegrees: 0.1 }], // both rules: the coarser (0.1° ≈ 11.1 km at the equator)
    [['Serenella alticola', 'x', '1'], { gridMeters: 20000 }], // both rules: 20 km is coarser than 0.1°
    [['Aubracia marina', 'x', 'No'], undefined],
    [['Aubracia marina', 'x', '0'], undefined],
    [['Telmoa ambigua var. minor', 'x', ''], undefined], // exact after folding only
  ];
  for (const [row, expected] of cases) it(`${row.join(' / ')} → ${JSON.stringify(expected)}`, () => expect(pick(row)).toEqual(expected));

  it('reads the settings a job stored before grids in meters: a bare number is a grid in degrees', () => {
    expect(sensitiveGeneralisation(['scientificName'], { taxa: { 'telmoa ambigua': 0.01 } })(['Telmoa ambigua'])).toEqual({ gridDegrees: 0.01 });
  });

  it('the marking column with a stated distance', () => {
    expect(sensitiveGeneralisation(header, { column: 'withhold', distanceMeters: 3000 })(['x', 'x', 'yes'])).toEqual({ distanceMeters: 3000 });
  });

  it('refuses a marking column the input lacks, and a list when the input has no scientificName', () => {
    expect(() => sensitiveGeneralisation(['locality'], { column: 'withhold', gridDegrees: 0.1 })).toThrow(/no column "withhold"/);
    expect(() => sensitiveGeneralisation(['locality'], { taxa: {} })).toThrow(/needs a scientificName column/);
  });
});
