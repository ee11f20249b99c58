import { describe, expect, it } from 'vitest';
import { DARWIN_CORE_TERMS } from '../support/darwin-core-terms.ts';
import { appendedColumnNames } from '../../src/output/csv.ts';
import { GEOREFERENCE_TERMS } from '../../src/record/darwin-core.ts';
import { reportingDecimals } from '../../src/record/reported-precision.ts';
import { VERIFICATION_STATUS } from '../../src/record/verification-status.ts';

describe('appended Darwin Core fields', () => {
  it('names only Darwin Core terms', () => {
    for (const term of GEOREFERENCE_TERMS) expect(DARWIN_CORE_TERMS.has(term), term).toBe(true);
  });

  it('keeps an existing column and proposes beside it', () => {
    const names = appendedColumnNames(['occurrenceID', 'locality', 'decimalLatitude', 'decimalLongitude']);
    expect(names).toContain('proposed_decimalLatitude');
    expect(names).toContain('proposed_decimalLongitude');
    expect(names).toContain('geodeticDatum');
    for (const name of names) expect(DARWIN_CORE_TERMS.has(name.replace(/^proposed_/, '')), name).toBe(true);
  });

  it('uses the verification statuses Darwin Core recommends', () => {
    // Darwin Core georeferenceVerificationStatus examples (TDWG): "requires verification",
    // "unable to georeference", "requires georeference".
    expect(VERIFICATION_STATUS.georeferenced).toBe('requires verification');
    expect(VERIFICATION_STATUS.ambiguous).toBe('requires georeference');
    expect(VERIFICATION_STATUS['not-found']).toBe('requires georeference');
    expect(VERIFICATION_STATUS.unparseable).toBe('unable to georeference');
  });
});

describe('reporting decimals', () => {
  // Our own rule (docs/method.md §6 [CHOICE]): rounding moves the point by at most 1 % of the radius.
  it('never rounds away more than 1 % of the radius', () => {
    for (const radius of [3, 30, 300, 3000, 30000, 300000]) {
      const k = reportingDecimals(radius);
      const worstShiftMeters = (10 ** -k / 2) * Math.SQRT2 * 111_694;
      if (k < 7) expect(worstShiftMeters).toBeLessThanOrEqual(radius / 100);
      if (k > 0) expect((10 ** -(k - 1) / 2) * Math.SQRT2 * 111_694).toBeGreaterThan(radius / 100);
    }
  });
});
