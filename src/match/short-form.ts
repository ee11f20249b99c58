/**
 * The short form of a town's official long name: in Spanish-speaking countries many towns add to their
 * own name "de" or "del" and the surname or title of a person they honour ("Texcoco de Mora",
 * "Xalapa de Enríquez", "Tixtla de Guerrero"), and labels write the town's own name ("Texcoco", "Jalapa").
 * Read only while [CHOICE honoreeShortForms, src/georef/method-defaults.ts] is 'on', and only when no
 * other loaded place of the stated state (of the stated countries, when no state is stated) begins with
 * the short name (the matcher checks that; a longer name is otherwise most often another place, [CHOICE
 * nameAsFirstWords]); without a stated state only beside what looser readings find, never alone.
 * Common practice in those countries' official names, no source. Pure, no I/O.
 */
import { FEATURE_KIND_WORDS } from '../parse/lexicon.ts';
import { foldName, LEADING_ARTICLES } from './fold.ts';
import { SPANISH_SPEAKING_COUNTRIES } from './older-spelling.ts';

/**
 * Words that say what, where or when, not whom ("del Valle", "de Río Grande", "del Oro", "Veinte de
 * Noviembre"), beside the generic words of the lexicon (lake, river, mountain, farm, road, park, town):
 * after "de" the longer name is a name of its own, and before it they are no town's own name ("Valle" of
 * "Valle de Bravo"). Common words of Spanish place names, from memory; no source.
 */
const COMMON_WORDS: ReadonlySet<string> = new Set([
  'valle', 'mar', 'aire', 'oro', 'plata', 'agua', 'aguas', 'sal', 'campo', 'llano', 'llanos', 'norte', 'sur', 'oriente',
  'poniente', 'centro', 'arriba', 'abajo', 'puerto', 'playa', 'bosque', 'mina', 'minas', 'paso', 'puente', 'san',
  'santa', 'santo', 'nuestra', 'dios', 'camino', 'carbon', 'progreso', 'refugio', 'rosario', 'carmen', 'lomas',
  'arena', 'enero', 'febrero', 'marzo', 'abril', 'mayo', 'junio', 'julio', 'agosto', 'septiembre', 'octubre',
  'noviembre', 'diciembre',
]);

/** A word that is an article, a generic word or a common word: it names no one and, alone, no town. */
const common = (word: string) => LEADING_ARTICLES.has(word) || FEATURE_KIND_WORDS.has(word) || COMMON_WORDS.has(word);

/** At most this many words of honoree after "de" or "del" ("Ignacio de la Llave"); common practice, no source. */
const MAX_HONOREE_WORDS = 4;

/** True when features of this country (ISO 3166-1 alpha-2) may carry an honoree's name after their own. */
export function honoreeCountry(countryCode: string | null): boolean {
  return countryCode !== null && SPANISH_SPEAKING_COUNTRIES.has(countryCode.toUpperCase());
}

/**
 * True when `longName` is the folded name `short` followed by "de" or "del" and an honoree of at most
 * MAX_HONOREE_WORDS words whose first is no common word, and `short` holds a word that is not common.
 * @example honoreeLongForm('Texcoco de Mora', 'texcoco') // true
 * @example honoreeLongForm('Teotitlán del Valle', 'teotitlan') // false
 * @example honoreeLongForm('San Juan de los Lagos', 'san juan') // false
 * @example honoreeLongForm('Valle de Bravo', 'valle') // false
 */
export function honoreeLongForm(longName: string, short: string): boolean {
  const folded = foldName(longName);
  if (!folded.startsWith(`${short} `) || short.split(' ').every(common)) return false;
  const [joiner, first, ...rest] = folded.slice(short.length + 1).split(' ');
  return (joiner === 'de' || joiner === 'del') && first !== undefined && rest.length < MAX_HONOREE_WORDS && !common(first);
}
