/**
 * Darwin Core term names as a header or a metafile may write them: the term's name alone
 * ("decimalLatitude") or its full URI ("http://rs.tdwg.org/dwc/terms/decimalLatitude").
 */

/** Namespaces whose terms are known by their local name (TDWG Darwin Core terms list; DCMI Metadata Terms). */
export const TERM_NAMESPACES = ['http://rs.tdwg.org/dwc/terms/', 'http://purl.org/dc/terms/'] as const;

/** The Darwin Core terms namespace: the URI of a term is this followed by its name. */
export const DWC_NAMESPACE = TERM_NAMESPACES[0];

/**
 * The short name of a header or term URI: the local name for a Darwin Core or Dublin Core term URI
 * (http or https), otherwise the text unchanged.
 * @example termName('http://rs.tdwg.org/dwc/terms/locality') // 'locality'
 * @example termName('https://example.org/x') // 'https://example.org/x'
 */
export function termName(header: string): string {
  for (const namespace of TERM_NAMESPACES) {
    const https = namespace.replace('http:', 'https:');
    if (header.startsWith(namespace) && header.length > namespace.length) return header.slice(namespace.length);
    if (header.startsWith(https) && header.length > https.length) return header.slice(https.length);
  }
  return header;
}
