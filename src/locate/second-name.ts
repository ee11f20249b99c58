/**
 * A second name written in brackets after a place's name ("Alisos (Alisitos)", an older or other name of
 * the same place, read by the parser as `secondName`): tried when the first name is not found, as the same
 * place, so the radius is the place's own. Pure.
 */
import { foldName } from '../match/fold.ts';
import type { AdministrativeContext, Interpretation } from '../parse/types.ts';

/**
 * The reading with the second name in place of the first, the note saying so; undefined when the text
 * writes none, or when it is one of the record's own units ("Cerro Alto (Alisos)" in the county Alisos:
 * the unit that holds the place, not a second name of it).
 * @example secondNameReading(parseLocality('Alisos (Alisitos)'), { countryCode: 'QV' })?.features // ['Alisitos']
 */
export function secondNameReading(interpretation: Interpretation, context: AdministrativeContext): Interpretation | undefined {
  const { secondName, features } = interpretation;
  if (!secondName || features.length !== 1) return undefined;
  const units = [context.country, context.stateProvince, context.county, context.municipality].filter((n): n is string => !!n?.trim()).map(foldName);
  if (units.includes(foldName(secondName))) return undefined;
  const note = `"${features[0]}" is not in the loaded gazetteers: its second name written in brackets, "${secondName}", is used`;
  return { ...interpretation, features: [secondName], secondName: undefined, notes: [...interpretation.notes, note] };
}
