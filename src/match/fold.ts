/**
 * Name folding and the variants a written name may stand for: the keys both the store and a query use.
 * Pure functions, no I/O.
 */

/** Letters that Unicode decomposition does not split into a base letter and a mark. */
const LETTER_FOLDS: Record<string, string> = {
  ß: 'ss', æ: 'ae', œ: 'oe', ø: 'o', đ: 'd', ð: 'd', ł: 'l', þ: 'th', ı: 'i', ħ: 'h', ŧ: 't',
};
const LETTER_FOLD_PATTERN = new RegExp(`[${Object.keys(LETTER_FOLDS).join('')}]`, 'g');
const PLAIN_WORDS = /^[A-Za-z0-9]+(?: [A-Za-z0-9]+)*$/;

/**
 * Folds a name for comparison: case, accents and other marks, punctuation (including apostrophes and
 * hyphens, which become spaces) and runs of spacing. Letters of every script are kept (a Cyrillic or
 * Greek name folds to lower case without marks), so transliterations match only through alternate names.
 * @example foldName("  Sant Julià-de-Lòria ") // "sant julia de loria"
 * @example foldName('São Paulo') // "sao paulo"
 */
export function foldName(name: string): string {
  // Most names are plain ASCII words with single spaces: only their case needs folding.
  if (PLAIN_WORDS.test(name)) return name.toLowerCase();
  return name
    .normalize('NFKD')
    .replace(/\p{M}+/gu, '')
    .toLowerCase()
    .replace(LETTER_FOLD_PATTERN, (letter) => LETTER_FOLDS[letter])
    .replace(/[^\p{L}\p{N}]+/gu, ' ')
    .trim();
}

/**
 * Abbreviations written on labels in English, Spanish, Portuguese and French (folded, without the
 * period), each with the words it may stand for. Collected from common label usage: common practice,
 * no source. An abbreviation that stands for several words ("S." = San, Santa, Santo, São) gives one
 * variant per word, and the candidates decide.
 */
export const ABBREVIATIONS: Readonly<Record<string, readonly string[]>> = {
  st: ['saint', 'sankt'],
  ste: ['sainte'],
  sta: ['santa'],
  sto: ['santo'],
  sn: ['san'],
  s: ['san', 'santa', 'santo', 'sao'],
  mt: ['mount', 'mont', 'monte'],
  mte: ['monte'],
  mtn: ['mountain'],
  mts: ['mountains', 'montes', 'monts'],
  ft: ['fort', 'forte'],
  pt: ['point', 'port', 'porto', 'ponta'],
  pto: ['puerto', 'porto'],
  pte: ['puente', 'ponte', 'pointe'],
  pta: ['punta', 'ponta'],
  co: ['cerro'],
  r: ['rio', 'river', 'riviere'],
  ro: ['rio'],
  rib: ['ribeirao'],
  ao: ['arroyo'],
  arr: ['arroyo'],
  qda: ['quebrada'],
  qbda: ['quebrada'],
  cno: ['camino'],
  fz: ['fazenda'],
  faz: ['fazenda'],
  hda: ['hacienda'],
  ea: ['estancia'],
  est: ['estancia', 'estacion', 'estacao'],
  lag: ['laguna', 'lagoa'],
  lgo: ['lago'],
  pq: ['parque'],
  sra: ['senora', 'senhora'],
  nsa: ['nossa'],
  ns: ['nossa senhora'],
  vla: ['villa'],
  gral: ['general'],
  pres: ['presidente'],
  cel: ['coronel'],
  cnel: ['coronel'],
};

/**
 * Generic words that labels and gazetteers add or leave out freely ("Fazenda Santa Rita" = "Santa Rita");
 * common practice, no source.
 */
export const OPTIONAL_GENERIC_WORDS: ReadonlySet<string> = new Set([
  'fazenda', 'hacienda', 'estancia', 'rancho', 'finca', 'sitio', 'chacara', 'chacra', 'granja', 'ranch',
]);

/** Articles that may stand before a name or be left out ("El Carmen" = "Carmen"); common practice, no source. */
export const LEADING_ARTICLES: ReadonlySet<string> = new Set([
  'el', 'la', 'los', 'las', 'lo', 'o', 'a', 'os', 'as', 'le', 'les', 'l', 'the',
]);

/** A folded key a name may be looked up by, with the reason it differs from the folded name. */
export interface NameVariant {
  key: string;
  /** Plain words, e.g. "'sta' read as 'santa'"; absent for the folded name itself. */
  change?: string;
}

const MAX_VARIANTS = 12;

/**
 * The folded name and the variants it may stand for: abbreviations expanded (one variant per reading),
 * optional generic words and a leading article left out. The first variant is always the folded name.
 * @example nameVariants('Faz. Sta. Rita').map((v) => v.key)
 * // ['faz sta rita', 'fazenda santa rita', 'santa rita', ...]
 */
export function nameVariants(name: string): NameVariant[] {
  const folded = foldName(name);
  const variants: NameVariant[] = [{ key: folded }];
  // Most names hold no abbreviation, generic word or article: they have no other reading.
  if (!folded.split(' ').some((token) => Object.hasOwn(ABBREVIATIONS, token) || OPTIONAL_GENERIC_WORDS.has(token) || LEADING_ARTICLES.has(token))) return variants;
  const seen = new Set([folded]);
  const add = (key: string, change: string) => {
    if (key === '' || seen.has(key) || variants.length >= MAX_VARIANTS) return;
    seen.add(key);
    variants.push({ key, change });
  };
  const expanded = expandAbbreviations(folded.split(' '));
  for (const { tokens, change } of expanded) add(tokens.join(' '), change);
  for (const { tokens, change } of [{ tokens: folded.split(' '), change: '' }, ...expanded]) {
    const stripped = tokens.filter((token) => !OPTIONAL_GENERIC_WORDS.has(token));
    if (stripped.length > 0 && stripped.length < tokens.length) {
      add(stripped.join(' '), joinChanges(change, 'generic word left out'));
    }
    if (stripped.length > 1 && LEADING_ARTICLES.has(stripped[0])) {
      add(stripped.slice(1).join(' '), joinChanges(change, `article '${stripped[0]}' left out`));
    }
  }
  return variants;
}

function joinChanges(a: string, b: string): string {
  return a === '' ? b : `${a}, ${b}`;
}

/** Every reading of the abbreviations in a token list (a single-token name is never read as one). */
function expandAbbreviations(tokens: string[]): { tokens: string[]; change: string }[] {
  if (tokens.length < 2) return [];
  let readings: { tokens: string[]; changes: string[] }[] = [{ tokens: [], changes: [] }];
  for (const token of tokens) {
    const expansions = Object.hasOwn(ABBREVIATIONS, token) ? ABBREVIATIONS[token] : [];
    const next: { tokens: string[]; changes: string[] }[] = [];
    for (const reading of readings) {
      next.push({ tokens: [...reading.tokens, token], changes: reading.changes });
      for (const word of expansions) {
        next.push({ tokens: [...reading.tokens, word], changes: [...reading.changes, `'${token}' read as '${word}'`] });
      }
    }
    readings = next.slice(0, MAX_VARIANTS * 2);
  }
  return readings
    .filter((reading) => reading.changes.length > 0)
    .map((reading) => ({ tokens: reading.tokens.join(' ').split(' '), change: reading.changes.join(', ') }));
}
