/**
 * Country names as the parser knows them, from the CLDR region names that Node's Intl carries: enough
 * to tell, from the text alone, whether a clause names a country ("Brasil", "Costa Rica").
 * Pure; the tables are built once, on first use.
 */
import { whereAlpha2, whereAlpha3 } from 'iso-3166-1';
import { foldedWords } from './clauses.ts';
import { tokenize, type Token } from './tokens.ts';

/** The four languages the parser reads. */
export const COUNTRY_NAME_LANGUAGES = ['en', 'es', 'pt', 'fr'] as const;

/**
 * Every two-letter region code that CLDR names in the languages (Node's Intl), with its name in each,
 * code by code and, for one code, in the order of the languages.
 * @example regionNames(['en']).find((r) => r.code === 'BR') // { code: 'BR', name: 'Brazil', language: 'en' }
 */
export function regionNames(languages: readonly string[]): { code: string; name: string; language: string }[] {
  const displays = languages.map((language) => ({ language, display: new Intl.DisplayNames([language], { type: 'region', fallback: 'none' }) }));
  const names: { code: string; name: string; language: string }[] = [];
  for (let first = 65; first <= 90; first++) {
    for (let second = 65; second <= 90; second++) {
      const code = String.fromCharCode(first, second);
      for (const { language, display } of displays) {
        const name = display.of(code);
        if (name !== undefined && name !== code) names.push({ code, name, language });
      }
    }
  }
  return names;
}

/**
 * Languages whose country names stand on older labels beside the four read throughout: German, Italian
 * and Dutch, from the CLDR region names Node's Intl carries (labels of European herbaria are often
 * written in them; common practice, no source).
 */
export const EXONYM_LANGUAGES = ['de', 'it', 'nl'] as const;

/**
 * Latin names of countries written on older labels, which CLDR does not carry: from memory (the
 * New Latin names of the Americas' countries), so short and only where the Latin differs from the
 * names in the other languages.
 */
export const LATIN_COUNTRY_NAMES: Readonly<Record<string, readonly string[]>> = {
  BR: ['Brasilia'], MX: ['Mexicum'], PY: ['Paraquaria'], UY: ['Uruguaia'], PE: ['Peruvia'], CO: ['Columbia'],
  VE: ['Venetiola'], CL: ['Chilia'], EC: ['Aequatoria'], GT: ['Guatimala'], US: ['Civitates Foederatae Americae'],
};

let countryNames: Set<string> | undefined;

/**
 * True when the tokens are a country's name, folded as the tokenizer folds words: in English, Spanish,
 * Portuguese or French, or in a language of older labels (German, Italian, Dutch, Latin).
 * @example namesCountry(tokenize('Costa Rica')) // true
 * @example namesCountry(tokenize('Brasilia')) // true (Latin)
 * @example namesCountry(tokenize('Cordillera de Talamanca')) // false
 */
export function namesCountry(tokens: Token[]): boolean {
  countryNames ??= new Set([
    ...regionNames([...COUNTRY_NAME_LANGUAGES, ...EXONYM_LANGUAGES]).map(({ name }) => name),
    ...Object.values(LATIN_COUNTRY_NAMES).flat(),
  ].map((name) => {
    const words = tokenize(name);
    return foldedWords(words, 0, words.length);
  }));
  return countryNames.has(foldedWords(tokens, 0, tokens.length));
}

/**
 * The ISO 3166-1 alpha-2 code a text writes as a code in capitals, alpha-2 or alpha-3 (the registry
 * package iso-3166-1 2.1.1), or null ("Brazil", "Bra", "XX").
 * @example countryCodeWritten('BRA') // 'BR'
 * @example countryCodeWritten('CR') // 'CR'
 */
export function countryCodeWritten(written: string): string | null {
  const code = written.trim();
  if (/^[A-Z]{2}$/.test(code)) return whereAlpha2(code)?.alpha2 ?? null;
  return /^[A-Z]{3}$/.test(code) ? whereAlpha3(code)?.alpha2 ?? null : null;
}
