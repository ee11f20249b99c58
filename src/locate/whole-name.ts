/**
 * A text whose words name no place as read ("Country Homes" a country, "Woodland" a habitat, "Forks" a junction,
 * "Summit" a word qualifying nothing) that is also, whole, a town's name: the parser offers the whole text as
 * `wholeName` beside its reading, and the gazetteer decides [CHOICE wordNamedTown]. Pure: the gazetteer is
 * reached only through the finder.
 */
import { foldName } from '../match/fold.ts';
import type { CandidateFinder } from '../match/types.ts';
import type { AdministrativeContext, Interpretation } from '../parse/types.ts';
import type { MethodOptions } from '../georef/types.ts';
import { METHOD_DEFAULTS } from '../georef/method-defaults.ts';
import { SETTLEMENTS } from './feature-kind.ts';

/** A settlement's feature types: the named kinds, and the generic type of a gazetteer that does not say which. */
const SETTLEMENT_TYPES: ReadonlySet<string> = new Set([...SETTLEMENTS, 'populated place']);

/**
 * The reading of the whole text as one named place, when the choice is 'town', the record states its country
 * and the gazetteer holds a settlement of that very name (as written, folded; no other reading of it, no near
 * spelling) inside the record's stated units; else the interpretation as it was.
 * @example wholeNameRead(store, parseLocality('Forks'), { countryCode: 'US', stateProvince: 'Washington' }, {}).features // ['Forks']
 */
export function wholeNameRead(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext, options: MethodOptions): Interpretation {
  const name = interpretation.wholeName;
  if (!name || !context.countryCode?.trim() || (options.wordNamedTown ?? METHOD_DEFAULTS.wordNamedTown) !== 'town') return interpretation;
  const key = foldName(name);
  const held = finder.findCandidates({ name, context, nearSpellings: 'off' }).some((c) => foldName(c.matchedName) === key && SETTLEMENT_TYPES.has(c.feature.featureType ?? ''));
  if (!held) return interpretation;
  const asRead = interpretation.reason ?? interpretation.notes.find((n) => n.startsWith('only an administrative unit')) ?? `read as ${interpretation.type}`;
  const note = `"${name}" is, whole, the name of a settlement loaded in the record's stated units: read as that place, not by its words (${asRead}) [CHOICE wordNamedTown, src/georef/method-defaults.ts]`;
  return {
    ...interpretation,
    type: 'named-place',
    chosenClause: interpretation.clauses.length === 1 ? 0 : interpretation.chosenClause,
    features: [name],
    offsets: [],
    unit: undefined,
    featureKind: undefined,
    reason: undefined,
    wholeName: undefined,
    notes: [...interpretation.notes.filter((n) => !n.startsWith('only an administrative unit')), note],
  };
}
