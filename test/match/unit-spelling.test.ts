/**
 * A name written as a near spelling of the record's own county ([CHOICE countyNearSpellings]): one word of at
 * least 8 letters each, the same first letter, at most a third of the longer one's letters differing (common
 * practice for misspelt names, no source). Invented names; the edit counts are by hand.
 */
import { describe, expect, it } from 'vitest';
import { isNearSpellingOfUnit } from '../../src/match/unit-spelling.ts';

describe('isNearSpellingOfUnit', () => {
  it.each([
    ['Verdmarinho', 'VERDEMARINHO', 'one letter left out'],
    ['Tlacoyalco', 'Tlaucoyualco', 'two letters left out of 12'],
    ['Hitamarco', 'Hueytamarco', 'three edits of 11 letters'],
  ])('reads "%s" as the county %s (%s)', (written, unit) => {
    expect(isNearSpellingOfUnit(written, unit)).toBe(true);
  });

  it.each([
    ['Verdemarinho', 'Verdemarinho', 'the same name is no near spelling'],
    ['Alisitos', 'Alisos', 'the county is shorter than 8 letters'],
    ['Puerto Lindo', 'Puerto Lindos', 'two words'],
    ['Bertamarco', 'Hueytamarco', 'another first letter'],
    ['Hitamarcos', 'Hueytamarco', 'four edits of 11 letters'],
  ])('does not read "%s" as the county %s (%s)', (written, unit) => {
    expect(isNearSpellingOfUnit(written, unit)).toBe(false);
  });
});
