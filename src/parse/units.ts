/**
 * Distance units as written in four languages and their length in meters, the league with its
 * documented range.
 * @example toMeters(3, 'mi') // 4828.032
 */
import type { DistanceUnit } from './types.ts';

/**
 * The league as whereabouts reads it. Leagues on Iberian, French and English labels ranged from the French
 * "lieue de poste" (about 3898 m) to the Portuguese "légua de sesmaria" (about 6600 m) — both values from
 * memory, no source checked. We take the middle of that range and add half the range, per league written,
 * to δ (docs/method.md §7: "document the value used and add its spread to δ") [CHOICE].
 */
export const LEAGUE_RANGE_METERS = { low: 3898, high: 6600 } as const;
/** Nominal league: the middle of LEAGUE_RANGE_METERS, 5249 m. */
export const LEAGUE_METERS = (LEAGUE_RANGE_METERS.low + LEAGUE_RANGE_METERS.high) / 2;
/** Extra uncertainty per league written, as a fraction of the distance: half the range / nominal value. */
export const LEAGUE_RELATIVE_SPREAD = (LEAGUE_RANGE_METERS.high - LEAGUE_RANGE_METERS.low) / 2 / LEAGUE_METERS;

/**
 * Length units a locality can be written in, with their definitions in meters.
 * Sources: international yard and pound agreement (1959) for the yard, foot and mile; First International
 * Extraordinary Hydrographic Conference (Monaco, 1929) for the nautical mile (docs/method.md §7).
 */
export const METERS_PER_UNIT: Readonly<Record<DistanceUnit, number>> = {
  m: 1,
  km: 1000,
  // 1959 agreement: 1 yd = 0.9144 m exactly; 1 ft = 1/3 yd = 0.3048 m; 1 mi = 1760 yd = 1609.344 m.
  mi: 1609.344,
  ft: 0.3048,
  yd: 0.9144,
  // 1929 international nautical mile.
  nmi: 1852,
  league: LEAGUE_METERS,
};

/**
 * Unit words in the four languages, accents removed and lower-cased, mapped to the unit they name.
 * A trailing period is removed by the tokenizer before lookup ("km." → "km").
 */
export const UNIT_WORDS: ReadonlyMap<string, DistanceUnit> = new Map<string, DistanceUnit>([
  ...words('m', 'm mt mts meter meters metre metres metro metros metre metres'),
  ...words('km', 'km kms kilometer kilometers kilometre kilometres kilometro kilometros quilometro quilometros klm'),
  ...words('mi', 'mi mis mile miles milla millas milha milhas mille milles'),
  ...words('ft', 'ft feet foot pie pies pes pied pieds'),
  ...words('yd', 'yd yds yard yards yarda yardas'),
  ...words('nmi', 'nmi nm'),
  ...words('league', 'league leagues legua leguas lieue lieues lg lgs'),
]);

function words(unit: DistanceUnit, list: string): Array<[string, DistanceUnit]> {
  return list.split(' ').map((w) => [w, unit]);
}

/**
 * Converts a length in a written unit to meters. Exact for every unit but the league (see LEAGUE_METERS).
 * @example toMeters(10, 'mi') // 16093.44
 */
export function toMeters(value: number, unit: DistanceUnit): number {
  return value * METERS_PER_UNIT[unit];
}
