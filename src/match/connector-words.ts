/**
 * A town's name written without the small word joining its parts, or with another: "San Manuel Colohete" for
 * San Manuel de Colohete, "Campos de Jordão" for Campos do Jordão, "Rio Janeiro" for Rio de Janeiro. Labels
 * drop and swap these words often; the gazetteer keeps the official form. Read only while [CHOICE
 * connectorReadings, src/georef/method-defaults.ts] is 'on', and only inside a stated country and state. Common
 * practice, no source. Pure, no I/O.
 */

/** The joining words of the four languages: "of" and its contracted forms, and the article "la" inside a name. */
const CONNECTORS: ReadonlySet<string> = new Set(['de', 'del', 'da', 'do', 'dos', 'das', 'du', 'des', 'of', 'la']);

/**
 * A folded name without its joining words, or null when fewer than two other words are left (a one-word name
 * with a joining word added or dropped is a different name too often: "Dos" and "Rio Dos").
 * @example withoutConnectors('san manuel de colohete') // 'san manuel colohete'
 * @example withoutConnectors('rio de janeiro') // 'rio janeiro'
 * @example withoutConnectors('la paz') // null
 */
export function withoutConnectors(folded: string): string | null {
  const words = folded.split(' ').filter((word) => word !== '' && !CONNECTORS.has(word));
  return words.length >= 2 ? words.join(' ') : null;
}
