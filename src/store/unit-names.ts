/**
 * The names and codes a state, county or municipality read from a gazetteer file is known by in the store's unit
 * names (the table the world dump's admin code files fill), and the note when a file's features record
 * their state by a code that no loaded state holds. Pure.
 */
import { UNIT_FIELD_LEVELS } from '../match/context.ts';
import type { UnitLevel } from '../match/types.ts';
import type { FeatureRecord } from './gazetteer-store.ts';

/**
 * Whether a gazetteer file of `format` records its states', counties' and municipalities' names row by row, each
 * tied to its unit's own feature: every format but the dump layout, whose admin code files name its units instead.
 * @example recordsUnitsByRow('shapefile') // true
 */
export function recordsUnitsByRow(format: string): boolean {
  return format !== 'geonames';
}

/**
 * An ISO 3166-2 code: the country's alpha-2 code, a hyphen and up to three letters or digits for the
 * subdivision (ISO 3166-2, from memory: "US-WA", "BR-SP", "FR-75C"); its subdivision part is the code
 * records and county files write alone ("WA").
 */
const ISO_3166_2 = /^([A-Za-z]{2})-([A-Za-z0-9]{1,3})$/;

/**
 * A state's, county's or municipality's level and its names beside its own: its alternate names, its codes, and the
 * subdivision part of an ISO 3166-2 code of its own country; null for a feature of another type.
 * @example unitNamesOf({ name: 'Washington', alternateNames: ['WA', 'Wash.'], featureType: 'stateProvince', countryCode: 'US' }, ['US-WA'])
 * // { level: 1, name: 'Washington', names: ['WA', 'Wash.', 'US-WA'] } ("WA", the subdivision part of US-WA, is among them already)
 */
export function unitNamesOf(record: Pick<FeatureRecord, 'name' | 'alternateNames' | 'featureType' | 'countryCode'>, codes: readonly string[] = []): { level: UnitLevel; name: string; names: string[] } | null {
  const type = record.featureType;
  if (type === null || !Object.hasOwn(UNIT_FIELD_LEVELS, type)) return null;
  const level = UNIT_FIELD_LEVELS[type as keyof typeof UNIT_FIELD_LEVELS];
  const names = new Set(record.alternateNames);
  for (const written of codes) {
    const code = written.trim();
    if (code === '') continue;
    names.add(code);
    const iso = ISO_3166_2.exec(code);
    if (iso && (record.countryCode === null || iso[1]!.toUpperCase() === record.countryCode)) names.add(iso[2]!);
  }
  names.delete(record.name);
  return { level, name: record.name, names: [...names] };
}

/**
 * A code as county files write a unit's state: two or three letters or digits ("WA", "53"), or an ISO
 * 3166-2 code ("US-WA"). Common practice, no source.
 */
const CODE = /^(?:[A-Za-z0-9]{1,3}|[A-Za-z]{2}-[A-Za-z0-9]{1,3})$/;

/**
 * The note for the state codes a file's features record (`stateProvince`, with how many features record
 * each) that name no loaded state or province by any of its names or codes (`named`, the store's unit
 * names of level 1): those features meet a record that writes the state by its name only through a loaded
 * state's polygon. Null when every code names a loaded state. Names that are no code are left out: a name
 * is compared as written.
 * @example parentCodeNote(new Map([['WA', 41], ['ID', 42]]), () => false)
 * // 'the state/province codes "WA" (41 features), "ID" (42 features) name no state or province loaded (by a name or code) …'
 */
export function parentCodeNote(recorded: ReadonlyMap<string, number>, named: (code: string) => boolean): string | null {
  const unknown = [...recorded].filter(([code]) => CODE.test(code) && !named(code));
  if (unknown.length === 0) return null;
  const listed = unknown.slice(0, 10).map(([code, count]) => `"${code}" (${count} feature${count === 1 ? '' : 's'})`).join(', ');
  return `the state/province code${unknown.length === 1 ? '' : 's'} ${listed}${unknown.length > 10 ? ` and ${unknown.length - 10} more` : ''} name${unknown.length === 1 ? 's' : ''} no state or province loaded (by a name or code), so a record writing the state by its name meets these features only where the state's polygon is loaded: import the states with ${unknown.length === 1 ? 'this code' : 'these codes'} among their names or codes (--alternate-names-field, --unit-code-field), before or after this file`;
}
