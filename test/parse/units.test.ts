import { describe, expect, it } from 'vitest';
import { LEAGUE_METERS, LEAGUE_RANGE_METERS, LEAGUE_RELATIVE_SPREAD, METERS_PER_UNIT, parseLocality, toMeters } from '../../src/parse/index.ts';

// Definitions: international yard and pound agreement (1959): 1 yd = 0.9144 m, 1 ft = 1/3 yd, 1 mi = 1760 yd;
// international nautical mile (1929): 1852 m. The league is a documented choice (src/parse/units.ts, from memory).
describe('length units against their definitions', () => {
  it('yard, foot and mile follow the 1959 agreement', () => {
    expect(METERS_PER_UNIT.yd).toBe(0.9144);
    expect(METERS_PER_UNIT.ft).toBeCloseTo(0.9144 / 3, 15);
    expect(METERS_PER_UNIT.mi).toBeCloseTo(1760 * 0.9144, 9);
    expect(METERS_PER_UNIT.mi).toBe(1609.344);
  });

  it('nautical mile is the 1929 international value; km and m are SI', () => {
    expect(METERS_PER_UNIT.nmi).toBe(1852);
    expect(METERS_PER_UNIT.km).toBe(1000);
    expect(METERS_PER_UNIT.m).toBe(1);
  });

  it('the league is the middle of its documented range and carries half the range in δ', () => {
    expect(LEAGUE_METERS).toBe((LEAGUE_RANGE_METERS.low + LEAGUE_RANGE_METERS.high) / 2);
    const distance = parseLocality('2 leguas al N de Puerto Lindo').offsets[0]!.distance!;
    expect(distance.unit).toBe('league');
    expect(distance.meters).toBe(2 * LEAGUE_METERS);
    // δ = precision/2 (0.5 league) + 2 leagues × relative spread
    expect(distance.uncertainty).toBeCloseTo(0.5 + 2 * LEAGUE_RELATIVE_SPREAD, 12);
    expect(distance.uncertaintyMeters).toBeCloseTo(0.5 * LEAGUE_METERS + (LEAGUE_RANGE_METERS.high - LEAGUE_RANGE_METERS.low), 6);
  });

  it('a number with no unit is marked unitAssumed and read provisionally in miles, the larger plausible unit', () => {
    // The method widens it to cover kilometres too (METHOD_DEFAULTS.unitlessDistanceUnits [CHOICE]).
    const distance = parseLocality('0.5 NW of Millbrook').offsets[0]!.distance!;
    expect(distance).toMatchObject({ written: '0.5', value: 0.5, unit: 'mi', unitAssumed: true, uncertainty: 0.25 });
    expect(distance.meters).toBeCloseTo(0.5 * 1609.344, 9);
    expect(parseLocality('5 km NW of Millbrook').offsets[0]!.distance!.unitAssumed).toBeUndefined();
  });

  it('converts written distances to meters', () => {
    expect(toMeters(10, 'mi')).toBeCloseTo(16093.44, 9);
    expect(parseLocality('3 nautical miles E of Redmere').offsets[0]!.distance!.meters).toBe(5556);
    expect(parseLocality('300 yd N of Redmere').offsets[0]!.distance!.meters).toBeCloseTo(274.32, 9);
    expect(parseLocality('2500 ft W of Redmere').offsets[0]!.distance!.meters).toBeCloseTo(762, 9);
  });
});
