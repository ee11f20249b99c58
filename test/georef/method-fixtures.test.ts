/**
 * Runs every fixture in test/fixtures/method: published worked examples and tables of the method
 * (docs/method.md, with the publication named in each case's `source`), input beside expected output.
 * The fixtures are transcriptions of printed values, so they are edited by hand and never regenerated.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { coordinatePrecisionMeters, degreeLengthsMeters } from '../../src/geodesy/coordinate-precision.ts';
import { mapAccuracyMeters, mapScaleErrorMeters, type MapAccuracyStandard } from '../../src/georef/map-scale.ts';
import { offsetUncertainty } from '../../src/georef/offset-uncertainty.ts';
import { circleWKT } from '../../src/georef/footprint.ts';
import { wktPolygonAreaSquareMeters } from './wkt-area.ts';

interface FixtureCase {
  source: string;
  input: Record<string, unknown>;
  expected: unknown;
  tolerance: number;
}

/** What each fixture file's `function` computes: returns [actual, expected] pairs for one case. */
const RUNNERS: Record<string, (c: FixtureCase) => [number, number][]> = {
  coordinatePrecisionMeters: ({ input, expected }) => [
    [coordinatePrecisionMeters(input.latitude as number, input.precisionDegrees as number), expected as number],
  ],
  degreeLengthsMeters: ({ input, expected }) => {
    const lengths = degreeLengthsMeters(input.latitude as number);
    const p = input.precisionDegrees as number;
    const want = expected as { latitude?: number; longitude?: number };
    return (['latitude', 'longitude'] as const).filter((axis) => want[axis] !== undefined).map((axis) => [p * lengths[axis], want[axis]!]);
  },
  offsetUncertainty: ({ input, expected }) => [
    [offsetUncertainty(input.distance as number, input.distanceUncertainty as number, input.halfWidthDegrees as number), expected as number],
  ],
  mapScaleErrorMeters: ({ input, expected }) => {
    const scale = input.scaleDenominator as number;
    const standard = input.standard as MapAccuracyStandard;
    const want = expected as { accuracy: number; total: number };
    return [
      [mapAccuracyMeters(scale, standard), want.accuracy],
      [mapScaleErrorMeters(scale, standard), want.total],
    ];
  },
  // The program reports no spatial fit; the published check still tests the footprint circle's area, and
  // the fit itself is the ratio of areas by definition (BP2020 §Determining Spatial Fit).
  spatialFit: ({ input, expected }) => {
    const circle = circleWKT(0, 0, input.circleRadiusMeters as number, 720);
    const given = wktPolygonAreaSquareMeters(circle);
    return [
      [given / 1e6, input.circleAreaSquareKilometers as number],
      [given / ((input.originalAreaSquareKilometers as number) * 1e6), expected as number],
    ];
  },
};

const directory = join(import.meta.dirname, '../fixtures/method');
for (const file of readdirSync(directory).filter((f) => f.endsWith('.json'))) {
  const fixture = JSON.parse(readFileSync(join(directory, file), 'utf8')) as { function: string; cases: FixtureCase[] };
  describe(`${file} (${fixture.function})`, () => {
    const run = RUNNERS[fixture.function];
    it('has a runner', () => expect(run).toBeDefined());
    for (const testCase of fixture.cases) {
      it(testCase.source, () => {
        for (const [actual, expected] of run!(testCase)) {
          expect(Math.abs(actual - expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(testCase.tolerance);
        }
      });
    }
  });
}
