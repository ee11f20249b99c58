/**
 * Fuzzing the parser (fast-check), 100,000 generated texts in all: arbitrary Unicode, texts built
 * from the pieces locality text is made of in the four languages, and written coordinates whose values
 * the generator knows. No text may throw, hang or reach the parser's internal-error fallback (which
 * would hide a crash as "unparseable"); every reading keeps its verbatim text and clause offsets.
 * Seeds are fixed so a failure reproduces; the run is bounded by the counts, some 5 s on 2 cores.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCoordinates, parseLocality } from '../../src/parse/index.ts';

const ARBITRARY_TEXTS = 40_000;
const LOCALITY_TEXTS = 40_000;
const COORDINATE_TEXTS = 20_000;

function checkReading(text: string): void {
  const reading = parseLocality(text);
  expect(reading.verbatim).toBe(text);
  expect(reading.reason ?? '').not.toMatch(/^internal parser error/);
  for (const clause of reading.clauses) expect(text.slice(clause.start, clause.end)).toBe(clause.text);
  const coordinates = parseCoordinates(text);
  if (!('problem' in coordinates)) {
    expect(Number.isFinite(coordinates.latitude) && Number.isFinite(coordinates.longitude)).toBe(true);
  }
}

/** Words and signs of locality text (invented place names; distance, heading and path words in en, es, pt, fr). */
const PIECES = [
  '10', '2.5', '1/2', '½', '3,5', 'ca.', '~', 'km', 'mi', 'm', 'leguas', 'léguas', 'lieues', 'mi.',
  'N', 'NE', 'SSW', 'NNE', 'S', 'W', 'O', 'L', 'north', 'norte', 'nord', 'sudeste', 'sud-ouest', 'by road', 'por camino',
  'pela estrada', 'par la route', 'of', 'de', 'do', 'du', 'from', 'between', 'entre', 'and', 'y', 'e', 'et', 'near',
  'cerca de', 'perto de', 'près de', 'junction', 'cruce', 'upstream', 'río arriba', 'Vila Serena', 'Caleta Brava',
  'Puerto Ñandú', 'Pont-Étoile', 'São Bento', '12°30\'S', '45°10\'W', '-12.5', 'UTM', '18T', '500000', 'Prov.', 'Depto.',
  ',', ';', ':', '.', '(', ')', '"', '\'', '°', '-', '/', '\n', '\t', '  ',
];

describe(`parser fuzzing, ${(ARBITRARY_TEXTS + LOCALITY_TEXTS + COORDINATE_TEXTS).toLocaleString('en')} generated texts`, () => {
  it(`reads ${ARBITRARY_TEXTS.toLocaleString('en')} arbitrary Unicode texts without a crash`, () => {
    fc.assert(fc.property(fc.string({ unit: 'grapheme', maxLength: 200 }), checkReading), { numRuns: ARBITRARY_TEXTS, seed: 7001 });
  });

  it(`reads ${LOCALITY_TEXTS.toLocaleString('en')} texts built from locality pieces without a crash`, () => {
    const text = fc.array(fc.constantFrom(...PIECES), { maxLength: 40 }).chain((pieces) =>
      fc.array(fc.constantFrom(' ', '', ', '), { minLength: pieces.length, maxLength: pieces.length })
        .map((gaps) => pieces.map((piece, i) => piece + gaps[i]).join('')));
    fc.assert(fc.property(text, checkReading), { numRuns: LOCALITY_TEXTS, seed: 7002 });
  });

  it(`reads back the values of ${COORDINATE_TEXTS.toLocaleString('en')} written coordinate pairs`, () => {
    // Degrees, minutes and seconds to decimal degrees, south and west negative (ISO 6709:2008;
    // Chapman & Wieczorek 2020, Georeferencing Best Practices, on coordinate formats; sections from memory).
    const axis = (maxDegrees: number, hemispheres: [string, string]) => fc.record({
      degrees: fc.integer({ min: 0, max: maxDegrees - 1 }),
      minutes: fc.integer({ min: 0, max: 59 }),
      seconds: fc.integer({ min: 0, max: 59 }),
      decimals: fc.integer({ min: 1, max: 6 }),
      fraction: fc.integer({ min: 0, max: 999_999 }),
      hemisphere: fc.constantFrom(...hemispheres),
    });
    const pair = fc.record({
      format: fc.constantFrom('dms', 'dm', 'decimal'),
      latitude: axis(90, ['N', 'S']),
      longitude: axis(180, ['E', 'W']),
      separator: fc.constantFrom(' ', ', ', '; '),
    });
    fc.assert(fc.property(pair, ({ format, latitude, longitude, separator }) => {
      const written = (a: typeof latitude) => {
        if (format === 'dms') return { text: `${a.degrees}°${a.minutes}'${a.seconds}"${a.hemisphere}`, value: a.degrees + a.minutes / 60 + a.seconds / 3600 };
        if (format === 'dm') return { text: `${a.degrees}°${a.minutes}'${a.hemisphere}`, value: a.degrees + a.minutes / 60 };
        const text = `${a.degrees}.${String(a.fraction).padStart(6, '0').slice(0, a.decimals)}`;
        return { text: `${text} ${a.hemisphere}`, value: Number(text) };
      };
      const lat = written(latitude);
      const lon = written(longitude);
      const read = parseCoordinates(`${lat.text}${separator}${lon.text}`);
      if ('problem' in read) throw new Error(`"${lat.text}${separator}${lon.text}": ${read.problem}`);
      expect(read.latitude).toBeCloseTo(latitude.hemisphere === 'S' ? -lat.value : lat.value, 9);
      expect(read.longitude).toBeCloseTo(longitude.hemisphere === 'W' ? -lon.value : lon.value, 9);
      expect(read.problems).toEqual([]);
    }), { numRuns: COORDINATE_TEXTS, seed: 7003 });
  });
});
