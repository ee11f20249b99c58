/**
 * Words of locality texts in English, Spanish, Portuguese and French, lower-cased with accents removed
 * (the tokenizer's `norm`). Multi-word phrases are arrays of norms. Kept together so that a curator can
 * see, in one place, every word the parser gives a meaning to.
 * @example APPROXIMATION_WORDS.has('circa') // true
 */

const set = (words: string): ReadonlySet<string> => new Set(words.split(' '));
/** Phrases indexed by their first word, so that matching at a token looks at only the phrases it can start. */
export type PhraseList = ReadonlyMap<string, ReadonlyArray<readonly string[]>>;
function phrases(list: string): PhraseList {
  const index = new Map<string, string[][]>();
  for (const phrase of list.split('|').map((p) => p.trim().split(' '))) {
    const bucket = index.get(phrase[0]!) ?? [];
    bucket.push(phrase);
    index.set(phrase[0]!, bucket);
  }
  return index;
}

/**
 * "ca.", "about", "aprox.", "environ", "~" before a number: recorded as approximate, changing no number (docs/method.md §3).
 * "cerca de" is "about" before a number and "near" before a place [CHOICE: decided by what follows].
 */
export const APPROXIMATION_WORDS = set('ca c circa about approx approximately apx around roughly some aprox aproximadamente apr unos unas uns umas cerca env environ ~ ±');

/** Approximation words that may also stand before a bare place name ("ca. Ashcombe", "~Vaubrun"). */
export const APPROXIMATE_BEFORE_PLACE = set('ca c circa approx approximately aprox aproximadamente ~');

/** Words before a second name in brackets that say it is an older or other name: "X (formerly Y)", "X (antes Y)", "X (ex Y)". */
export const SECOND_NAME_WORDS = set('formerly previously aka alias antes antiguamente anteriormente antigamente anciennement autrefois outrora ex');

/** Prepositions that may stand before a leading distance: "a 5 km de X", "à 5 km au sud de X", "at 5 km". */
export const LEADING_PREPOSITIONS = set('a at');

/** Words that introduce the feature an offset is measured from ("of", "de", "du", "d'"). */
export const FROM_WORDS = set("of from off de del desde depuis do da dos das du des d'");
/** FROM_WORDS that never stand inside a name ("from", "desde"), unlike "de", "do", "du". */
export const STRONG_FROM_WORDS = set('from off desde depuis');
/** A contracted "of the" that joins a line's capitalised generic word to the rest of its name: "Estrada do Sul", "Camino del Norte", "Sentier des Crêtes". */
export const NAME_GENITIVES = set('do da dos das du des del');

/** "Up to" after an offset's place ("12 km de X até Y", "12 del camino de X hasta Y"): Y is where the way goes, as with TOWARD_PHRASES, but never reverses a bearing. */
export const UP_TO_WORDS = phrases('ate | hasta');
/** A typing slip for "até" ("X ato Y"), read only where "até" is read: between an offset's place and the place the way leads to [CHOICE typedUpTo]. */
export const UP_TO_SLIPS = phrases('ato');

/** Words that introduce the feature a bearing points toward (the heading is reversed, docs/method.md §3). */
export const TOWARD_PHRASES = phrases('toward | towards | to | hacia | vers | rumo a | rumo ao | em direcao a | em direcao ao | en direccion a | en direction de');

/**
 * "X hacia Y", "X toward Y", "X rumo a Y", "X vers Y" with no distance: somewhere on the way from X toward Y,
 * read as between X and Y [CHOICE towardWithoutDistance]. Only words that cannot be part of a name ("to", "a" can).
 */
export const TOWARD_WITHOUT_DISTANCE = phrases('toward | towards | hacia | rumbo a | vers | en direction de | rumo a | rumo ao | em direcao a | em direcao ao | en direccion a');

/** Words that may stand before a heading: "al N", "ao sul", "au nord", "à l'est", "to the N". */
export const HEADING_PREFIXES = phrases("a la | a l' | al | ao | au | a | to the | l' | at | on a bearing of | on bearing");

/** "between X and Y" */
/** "between X and Y", "entre X y Y", "entre X e Y", "entre X et Y"; also opens a range ("entre 5 y 8 km"). */
export const BETWEEN_WORDS = set('between betw btw entre');
/** Words joining two names (between, junction) or two orthogonal offsets. */
export const CONJUNCTIONS = set('and & y e et with con com avec x');

/** Junction, confluence, crossing of two named lines. */
export const JUNCTION_WORDS = set(
  'junction jct jctn jnct junc jct confluence confl crossing intersection fork forks confluencia confluencias cruce cruzamento entroncamento empalme bifurcacion bifurcacao interseccion intersecao encrucijada confluent carrefour croisement jonction embranchement',
);
/** Words that may stand before a junction word ("at the junction", "en la confluencia", "au confluent"). */
export const JUNCTION_LEAD = set('at the en la el na no a au al');

/** near / vicinity / outskirts, as prefixes before the feature. "cerca de" + a number is an approximation instead. */
export const NEAR_PREFIXES = phrases(
  "in the vicinity of | on the outskirts of | vicinity of | outskirts of | environs of | near to | close to | just outside | outside of | near | nr | vic | vicinity | outside | around | " +
    "en los alrededores de | en las afueras de | en las inmediaciones de | alrededores de | inmediaciones de | afueras de | cerca de | cerca del | proximo a | proximo al | junto a | prox a | " +
    "nos arredores de | nas proximidades de | arredores de | proximidades de | perto de | perto da | perto do | proximo de | proximo da | proximo do | periferia de | " +
    "near of | about | in the area of | en los alrededores | aux abords de | aux abords du | abords de | " +
    "aux environs de | aux environs du | aux alentours de | a proximite de | pres de | pres du | pres d' | proche de | environs de | alentours de | banlieue de | " +
    // Latin "prope" (near), written on older labels in every language.
    'prope | ' +
    // "vecindad de X", "alrededor de X" (singular), "ao redor de X", "autour de X"; "cerca X" without "de".
    'vecindad de | vecindad del | en la vecindad de | vecindades de | alrededor de | alrededor del | ao redor de | ao redor do | ao redor da | ' +
    'nas vizinhancas de | vizinhancas de | vizinhanca de | au voisinage de | voisinage de | autour de | autour du | cerca | ' +
    // "above X", "arriba de X", "acima de X", "au-dessus de X": higher ground by X, no heading given.
    'above of | above | arriba de | arriba del | encima de | acima de | acima do | acima da | au dessus de | au dessus du | au-dessus de | au-dessus du | ' +
    // "behind X" places the specimen near X, no heading given.
    'behind | atras de | atras do | atras da | detras de | detras del | derriere',
);
/**
 * "near" words no place's name holds, so that one written inside what would be a name ends the name and starts
 * a clause of its own ("Puente Alto near Alisos", "Cañada Fría cerca de Alisos", "Morro Alto perto de Alisos",
 * "Pont Vieux près de Vaubrun"). Words that may be part of a name ("above", "behind", "around", "cerca" alone,
 * "junto a") are left out.
 */
export const INNER_NEAR_PHRASES = phrases(
  'near | near to | close to | in the vicinity of | vicinity of | cerca de | cerca del | alrededor de | alrededor del | en las inmediaciones de | en los alrededores de | ' +
    'perto de | perto da | perto do | nas proximidades de | nos arredores de | pres de | pres du | pres d\' | proche de | aux environs de | a proximite de',
);
/**
 * Generic words of unnamed relief before "near"/"of"/"above" X ("Mountains near X", "Hills of X", "colinas
 * cerca de X", "serras perto de X", "collines près de X"): the feature is unnamed; the reading is "near X".
 */
export const UNNAMED_RELIEF_WORDS = set('mountains mountain hills hill heights ridges ridge slopes montanas montes colinas lomas cerros serras morros colinas montagnes collines hauteurs');
/** Words joining such an unnamed feature to the place: "near" prefixes, and "of", "above" ("Hills of X"). */
export const UNNAMED_RELIEF_JOINERS = set('of above');

/** near / vicinity as suffixes after the feature ("X vicinity", "X y alrededores"). */
export const NEAR_SUFFIXES = phrases('and vicinity | vicinity | vic | area | outskirts | environs | surroundings | y alrededores | alrededores | e arredores | arredores | et environs | alentours | abords');

/** "N side of X", "lado norte de X", "margem sul", "rive nord": a heading-only part of the feature. */
export const SIDE_WORDS = set('side end part edge slope slopes flank bank shore lado extremo parte ladera flanco margen orilla margem encosta vertente banda cote rive versant flanc bout partie');

/** Roads, trails and rivers, for path offsets ("by road", "por camino", "par la route", "along the river"). */
/** Nouns of roads: a path offset in mode 'road'. */
export const ROAD_NOUNS = set('road rd roads hwy highway route rte camino carretera ctra carr ruta estrada estr rod rodovia caminho chemin br');
/** English words written between a distance's number and its unit that say how it was measured: "17 air miles", "12 road km", "3.5 trail mi" (es/pt/fr write these after the unit: "km en línea recta", "km pela estrada", "km à vol d'oiseau"). */
export const DISTANCE_HOW_WORDS: ReadonlyMap<string, 'air' | 'road' | 'trail'> = new Map([['air', 'air'], ['road', 'road'], ['trail', 'trail']]);
/** Nouns of trails and tracks: mode 'trail'. */
export const TRAIL_NOUNS = set('trail track path sendero vereda trocha picada trilha senda sentier piste');
/** Nouns of rivers and of travel by water: mode 'river'. */
export const RIVER_NOUNS = set('river r rio stream creek arroyo quebrada riviere ruisseau fleuve ribeirao corrego igarape boat canoe water');

/** Articles that may stand between a path preposition and its noun ("por el camino", "pela a", "par la route"). */
export const PATH_ARTICLES = set("the el la los las o a le les l'");
/** Words that may stand between a path preposition and a trail noun: "by foot trail", "by foot path". */
export const TRAIL_QUALIFIERS = set('foot mule horse pack');
/** Prepositions of a path: "by road", "via road", "por camino", "pela estrada", "par la route", "on Rd. 12". */
export const PATH_PREPOSITIONS = set('by via por pela pelo par on en na no sur');
/** "along X", "siguiendo X", "le long de X", "ao longo do X", "a lo largo de X". */
export const ALONG_PHRASES = phrases("along the | along | following | siguiendo | seguindo | a lo largo de | a lo largo del | a lo largo de la | ao longo de | ao longo do | ao longo da | le long de | le long du | le long de la | le long de l' | le long des");
/** Upstream and downstream in four languages: modes 'upstream' and 'downstream'. */
export const UPSTREAM_PHRASES = phrases('upstream | upriver | up river | up stream | rio arriba | aguas arriba | rio acima | aguas acima | en amont | amont');
export const DOWNSTREAM_PHRASES = phrases('downstream | downriver | down river | down stream | rio abajo | aguas abajo | rio abaixo | aguas abaixo | en aval | aval');
/** "by air" and its equivalents. */
export const BY_AIR_PHRASES = phrases("by air | air | airline | air line | by air line | straight line | in a straight line | in straight line | en linea recta | linea recta | por aire | em linha reta | linha reta | a vol d' oiseau | vol d' oiseau");
/** Words after a road noun that make a standalone road clause: "camino a Y", "road to Y", "estrada para Y". */
export const ROAD_TOWARD_WORDS = set('to a al para pour vers hacia rumo de');

/**
 * Words joining the two ends of a route: "Ipala to Amatillo", "de X a Y", "de X à Y", "X até Y", "X - Y", "X – Y",
 * "X / Y". Every one may also stand inside a name ("Puerto a Dentro"), so a split is only offered: the gazetteer
 * decides (src/locate/route.ts) [CHOICE routeReading].
 */
export const ROUTE_JOINERS = set('to a ao ate hasta - – — /');
/** Words for a stretch of road before its two ends: "trecho X/Y", "tramo X - Y", "tronçon X - Y" (road and trail nouns count too). */
export const ROUTE_STRETCH_WORDS = set('trecho tramo troncon ramal');
/** Words between a road noun and the first end: "estrada que liga X a Y", "camino que sigue de X a Y", "route qui relie X à Y". */
export const ROUTE_LINKS = phrases('que liga | que sigue | que une | que va | que vai | que conecta | qui relie | that joins | that links');

/**
 * Ordinal marks and endings written on a number: "1º", "2ª", "3o", "1er", "2e", "1st", "2nd", "3rd", "4th"
 * (the masculine ordinal "º" is also typed as a degree sign, and "°" for it).
 */
export const ORDINAL_ENDINGS = set('º ª ° o a er re e eme st nd rd th');
/** Words an ordinal numbers in locality text: districts, sections, branch lines, leagues, kilometres. */
export const ORDINAL_NOUNS = set(
  'distrito distritos subdistrito subdistritos district districts arrondissement arrondissements secao secoes seccao seccoes seccion secciones ' +
    'section sections ramal ramais ramales legua leguas league leagues lieue lieues km quilometro kilometro kilometre kilometer',
);
/** What joins ordinals in a list: "1º e 2º", "1st and 2nd", "1er et 2e", "1º, 2º". */
export const ORDINAL_JOINS = set(', e y et and & a to');

/** Elevation clauses: "alt. 1200-1500 m", "elev. 2500 ft", "1200 msnm", "800 m a.s.l.", "1900 m in height", "1200 m de haut". */
export const ELEVATION_WORDS = set('elev elevation alt altitude altitud altura elevacion elevacao height high tall hauteur haut');
/** Words that join a number and its unit to the elevation word after it without saying elevation themselves: "1900 m in height", "à 1200 m d'altitude". */
export const ELEVATION_LINK_WORDS = set("in of de d'");
/** Prepositions before an elevation's number ("à 1200 m d'altitude", "a 1200 m de altitud", "colline de 300 m de haut"): the clause then needs an elevation word. */
export const ELEVATION_LEAD_WORDS = set('a at em de of');
/** Units of an elevation clause, converted to meters (international foot, 1959). */
export const ELEVATION_UNITS: ReadonlyMap<string, 'm' | 'ft'> = new Map([
  ...[...set('m mt mts meters metres metros metres msnm masl msm')].map((w) => [w, 'm'] as [string, 'm']),
  ...[...set('ft feet pies pes pieds')].map((w) => [w, 'ft'] as [string, 'ft']),
]);
/** Sea-level words that may follow an elevation ("a.s.l.", "s.n.m.", "above sea level", "sobre el nivel del mar"). */
export const SEA_LEVEL_WORDS = set('a s l n m asl snm above sea level sobre el nivel del mar acima do da au dessus de la mer');

/**
 * Unit words and the administrative level they name (accents removed, trailing period dropped). Levels follow
 * the usual first/second/third-level use of each word in the four languages' countries; words whose level
 * differs between countries ("District", "Distrito", "Freguesia") name a bare 'unit' and fill no field.
 * A township ("Twp.") is a civil division below the county, read as a municipality. A "canton" is a state in one
 * country, a county in another and a township in Québec, and a "paroisse" a county in Louisiana and a municipality
 * in Québec: bare 'unit's. A Québec "MRC" (municipalité régionale de comté) is a county; a "comté" there is a
 * former county, replaced by the MRCs in the 1980s (from memory), whose name is often a region's or a river's and
 * no unit a gazetteer now holds: a bare 'unit', never a county to filter by or a town to stand in.
 * "Par." (parish), "Est." (estado), "Co.", "Mun.", "Dist." only count dotted and capitalised: "par" is French
 * "by", "est" "east".
 */
export const ADMINISTRATIVE_WORDS: ReadonlyMap<string, 'country' | 'stateProvince' | 'county' | 'municipality' | 'unit'> = new Map([
  ...[...set('country pais pays')].map((w) => [w, 'country'] as const),
  ...[...set('state province prov pcia provincia estado est edo dept depto dpto departamento department departement depart region regiao')].map((w) => [w, 'stateProvince'] as const),
  ...[...set('county co cty parish par partido mrc')].map((w) => [w, 'county'] as const),
  ...[...set('municipality municipio municipios mun mpio munic municipalite commune comuna concelho township twp')].map((w) => [w, 'municipality'] as const),
  ...[...set('district dist distrito distr freguesia parroquia canton paroisse comte')].map((w) => [w, 'unit'] as const),
]);
/** Short forms that names are written with, dotted ("Sta. Rosa", "Faz. Alisos", "Res. Biol."): a period after one never ends a name [CHOICE periodEndsName]. */
export const NAME_ABBREVIATIONS = set('sta sto ste sra snra faz hda fda est mte pto pte pta res rep biol nat natl prov dept gen pres cel cap gral');
/** Unit words that count only written with a capital and a period ("Par.", "Est."). */
export const DOTTED_ONLY_ADMINISTRATIVE_WORDS = set('par est co mun dist');
/** Of those, the ones that also count dotted in lower case ("(mun. Alisos)"): no other word of the four languages is written so. */
export const LOWER_CASE_DOTTED_ADMINISTRATIVE_WORDS = set('mun');

/**
 * Generic words that say what kind of place a name is, before it ("Laguna Negra", "Fazenda Boa Vista",
 * "Mount Ash") or after it ("Otter Creek", "Redmere Lake", "Alisos Ranch"). Only a hint for matching.
 */
export const FEATURE_KIND_WORDS: ReadonlyMap<string, import('./types.ts').FeatureKind> = new Map([
  ...[...set('lake lakes pond lagoon reservoir laguna lagunas lago lagos lagoa represa embalse acude lac etang lagune')].map((w) => [w, 'water'] as const),
  ...[...set('river creek brook stream rio riacho arroyo quebrada igarape corrego ribeirao riviere ruisseau fleuve')].map((w) => [w, 'stream'] as const),
  ...[...set('mount mountain mountains mt peak hill hills cerro cerros monte montana morro serra sierra pico loma volcan mont montagne colline pic')].map((w) => [w, 'mountain'] as const),
  ...[...set('ranch farm fazenda hacienda estancia finca sitio chacra granja ferme')].map((w) => [w, 'farm'] as const),
  ...[...set('road highway hwy camino carretera estrada rodovia chemin')].map((w) => [w, 'road'] as const),
  ...[...set('park parque parc reserve reserva refugio preserve sanctuary santuario')].map((w) => [w, 'protected-area'] as const),
  ...[...set('town city village ciudad pueblo villa vila cidade povoado aldea ville')].map((w) => [w, 'populated-place'] as const),
  ...[...set('paraje localidad lugar localidade lieu-dit')].map((w) => [w, 'locality'] as const),
]);

/**
 * Two words before a name that say it is a protected area, written out or by their initials: "Zona Protectora
 * Las Tablas", "Z. P. Las Tablas", "P. N." (parque nacional), "R. B." (reserva biológica), "R. F." (reserva
 * forestal); common practice on labels from Central and South America, no source.
 */
export const PROTECTED_AREA_LEADS = set('zona-protectora z-p p-n r-b r-f');
/** Words for a railway station, first or last in its name ("Estación Alisos", "Alisos Station", "Gare de Alisos"). */
export const STATION_WORDS = set('station estacion estacao gare');
/** Words that make a station a research or field station, not one named after a town ("Biological Station", "Estación Experimental"); common practice on labels, no source. */
export const STATION_QUALIFIERS = set('biological biologica biologique field research investigacion pesquisa recherche experimental experimentale agricultural agricola agronomica forestal florestal forest forestry ranger scientific cientifica scientifique marine marina');

/**
 * Words that say which kind of park or reserve a lead names, between the lead and the name it bears ("Parque
 * Nacional do Itatiaia", "Reserva Nac. Estricta San Antonio", "Reserva de Biósfera Yabotí", "Alisos State Park"):
 * not part of that name. Common practice on labels, no source.
 */
export const PROTECTED_AREA_QUALIFIERS = set(
  'nacional nac national estadual estatal provincial prov municipal regional federal state biologica biol biological forestal florestal ' +
    'forest natural nature ecologica ecological particular privada private estricta biosfera biosphere vida silvestre wildlife indigena ' +
    'nationale naturelle provinciale ecologique faunique',
);

/**
 * Feature-type words before a name, not part of it: "town of X", "ciudad de X", "povoado de X", "ville de X".
 * The name keeps its own "de" ("Ciudad de X" as a proper name is read as X, noted).
 */
export const PLACE_TYPE_PREFIXES = phrases(
  'the town of | the city of | the village of | town of | city of | village of | ciudad de | ciudad del | pueblo de | pueblo del | localidad de | paraje de | ' +
    "cidade de | cidade do | cidade da | povoado de | povoado do | povoado da | localidade de | ville de | ville d' | village de | village du | localite de | " +
    // "10 km S of center of X": the gazetteer's point of a town is its center.
    'center of | centre of | the center of | the centre of | centro de | centro del | centro do | centro da | centre de | centre du',
);
/** Feature-type words after a name or alone in brackets: "X (town)", "X city", "X (pueblo)". */
export const PLACE_TYPE_SUFFIXES = set('town city village pueblo ciudad cidade povoado vila ville village localidad localidade');
/**
 * Words naming a part of a mountain, before its name ("summit of X", "cumbre del X", "cume do X", "sommet du X"),
 * after it in lower case ("X summit") or alone after it ("X, summit area"): the part lies within the mountain,
 * so the mountain is the feature and its kind is kept, never a place named "summit".
 */
export const MOUNTAIN_PART_WORDS = phrases(
  'summit | summit area | summit region | top | cumbre | zona de cumbre | cima | cume | topo | sommet | cime | zone sommitale',
);
export const MOUNTAIN_PART_PREFIXES = phrases(
  'summit of | the summit of | summit area of | top of | the top of | cumbre de | cumbre del | cumbre de la | la cumbre de | la cumbre del | cima de | cima del | ' +
    "cume de | cume do | cume da | topo de | topo do | topo da | sommet de | sommet du | sommet de la | sommet de l' | sommet des | cime de | cime du | cime de la",
);
/** Words before the area a point lies in, after an offset's place: "in Jocko Mountains", "en la Sierra X", "na Serra X", "dans le parc X". */
export const WITHIN_WORDS = set('in within en em na no dans');
/** Prepositions before a bare place name that are not part of it: "in X", "on X", "en X", "em X", "à X". */
export const PLACE_PREPOSITIONS = set('in on en em at');

/**
 * Headings of a label's or a database's locality field, followed by a colon: "Locality: X", "Nearest named
 * place: X", "Localidad: X", "Localidade: X", "Lieu-dit: X". A heading names nothing; it is neither a place
 * nor a link of a written hierarchy. "Hab.:" heads a habitat.
 */
export const FIELD_HEADINGS: ReadonlySet<string> = new Set(
  'locality|loc|nearest named place|nearest place|named place|collecting locality|collection locality|site|localidad|lugar|sitio de colecta|localidade|local|local de coleta|localite|lieu|lieu dit|lieu-dit|station|habitat|hab'.split('|'),
);

/**
 * Texts that say no place is known, or that it is withheld ("[Redacted]", as portal downloads write a
 * locality their publisher withholds: not a place named "Redacted"), in four languages (whole clause,
 * folded, punctuation dropped: "s. loc." → "s loc").
 */
export const REFUSAL_PHRASES: ReadonlySet<string> = new Set(
  [
    'locality unknown|unknown locality|locality not known|locality not given|no locality|without locality|no locality given|no data|no loc|s loc|sl|s l|sine loco|sine loc|illegible|locality illegible|unknown|not recorded|none|na|n a|no information|not stated|exact locality unknown|redacted|locality redacted|withheld|locality withheld|location withheld',
    'sin localidad|localidad desconocida|localidad no indicada|sin datos|sin loc|ilegible|desconocido|desconocida|sin informacion|localidad ilegible|no indicada|sin procedencia',
    'sem localidade|localidade desconhecida|sem dados|sem local|ilegivel|desconhecido|desconhecida|localidade ilegivel|sem procedencia|local desconhecido|localidade nao informada',
    'sans localite|localite inconnue|sans donnees|illisible|inconnu|inconnue|lieu inconnu|localite illisible|sans indication|non precise|localite non precisee',
  ].join('|').split('|'),
);

/** Habitat and substrate words: a clause made only of these (and small words) describes no place. */
export const HABITAT_WORDS = set(
  'forest forests woods woodland rainforest cloud montane lowland pasture pastures grassland savanna savannah meadow swamp marsh bog wetland riverbank bank banks roadside secondary primary disturbed open dry wet humid moist scrub shrubland thicket thickets rocks rocky rock sandy sand soil slope slopes hillside edge edges under bark log logs leaf leaves litter canopy understory clearing field fields cultivated garden gallery riparian shore beach dunes mangrove cliff cliffs plantation coffee oak pine stream streams ' +
    'bosque bosques selva humedo humeda seco seca pastizal potrero matorral sabana orilla borde ribera cafetal pinar encinar ladera suelo hojarasca claro galeria bajo sobre secundario secundaria primario primaria quebrada ' +
    'mata floresta cerrado caatinga restinga varzea capoeira brejo campo campos beira margem solo serapilheira encosta beira estrada secundaria primaria umida ' +
    'foret bois lisiere prairie savane marais maquis garrigue sous-bois litiere pente sol rochers bord humide secondaire',
);
/** Small words that do not make a clause name a place. */
export const SMALL_WORDS = set("of the a an and in on at with de del la el los las y en con e da do das dos na no com o os as et du des le les l' d' au aux avec sur dans");

/** Words that mark each language (counted to set `language`). */
export const LANGUAGE_MARKERS: Readonly<Record<'en' | 'es' | 'pt' | 'fr', ReadonlySet<string>>> = {
  en: set('of from the and near road river mi miles north south east west between junction upstream downstream along by on ft feet vicinity outskirts unknown locality trail creek bridge data'),
  es: set('del al y cerca camino carretera norte sur este oeste millas leguas arriba abajo localidad sin desde hacia confluencia cruce noreste sureste suroeste noroeste alrededores afueras pies msnm por la el los las aprox quebrada arroyo ruta'),
  pt: set('ao da do dos das e perto estrada leste sul norte oeste milhas leguas acima abaixo localidade sem pela pelo nordeste sudeste sudoeste noroeste rodovia fazenda arredores entroncamento proximo o os na no corrego ribeirao'),
  fr: set("la du au aux et pres route riviere nord sud est ouest lieues amont aval localite sans par le les environ environs chemin piste l' d' des vers carrefour sentier ruisseau"),
};
