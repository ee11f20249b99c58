/**
 * Every setting of the method that the sources leave to us ([CHOICE] in docs/method.md), in one place.
 * A caller overrides any of them through MethodOptions; the remarks cite the section each comes from.
 */
export const METHOD_DEFAULTS = {
  /** Datum not stated and no regional datum applies: the global worst case, 5359 m (docs/method.md §5.4, BP2020 [DOC]). */
  unknownDatumMeters: 5359,
  /** "near X": radius r_f + max(r_f, this) (docs/method.md §3 [CHOICE]). */
  nearMinimumMeters: 1000,
  /** Own extent of a junction, confluence or crossing (docs/method.md §3 [CHOICE]). */
  junctionExtentMeters: 100,
  /** Segments of a footprint circle (WKT polygon vertices, docs/method.md §6 [CHOICE]). */
  footprintSegments: 64,
  /**
   * A distance written with no unit ("0.5 NW of X") [CHOICE]: our choice, no source — neither WGH2004 nor
   * BP2020 (§Uncertainty Related to Offset Precision) has a rule for a missing unit. Labels from the countries we
   * read use kilometres or miles, so the number is read in both and treated like a written range between the two
   * readings (the range rule of docs/method.md §5.1, itself a [CHOICE]): the midpoint, with δ = half the
   * spread + the written precision term (BP2020 δ = precision/2) taken in the larger unit. The circle then covers
   * the specimen whichever unit the collector meant (the two units, smaller first); a single guessed unit
   * would put it 38% too near or 61% too far.
   */
  unitlessDistanceUnits: 'km mi',
  /** Map accuracy standard when a map scale is given but no standard (docs/method.md §5.5: 1 mm only). */
  mapStandard: 'unknown',
  /**
   * How far a Natural Earth 1:50m shore or border may lie from the true one, for the plausibility checks
   * [CHOICE: 0.1 mm at 1:50 000 000 is 5 km, the usual reading of a printed line's accuracy; common
   * practice, no source].
   */
  naturalEarthToleranceMeters: 5000,
  /**
   * A locality clause names a place the gazetteer lacks ("Puerto Lindo, Laguna Negra" with no lake
   * loaded), or the place named first is missing and a later clause is used instead: the radius
   * grows by this much, the distance such a place may lie from the place used [CHOICE]. Chosen by
   * measurement on the real-record set (test/fixtures/real, npm run bench:real): see
   * docs/real-records.md for the figures of each value tried.
   */
  unusedFeatureMeters: 120000,
  /** What such a place does to the answer: 'widen' by unusedFeatureMeters, or 'decline' with the reason [CHOICE]. */
  unusedFeatureRule: 'widen',
  /**
   * A text that names an administrative unit whose polygon is not loaded is declined, never
   * georeferenced as a town of that name [CHOICE]: a default extent for a level would be dishonest for
   * most units of it (a Brazilian municipality spans from a few km² to over 150 000 km²; from memory).
   */
  unitWithoutPolygon: 'decline',
  /**
   * Except a county or municipality named alone (the label "Alisos" with the record's county Alisos),
   * whose seat usually bears its name: the one town of that name in the stated state, its radius
   * widened by this default extent of the unit [CHOICE]; 0 declines as for other units. Chosen by
   * measurement on the real-record sets (docs/real-records.md).
   */
  unitSeatMeters: 40000,
  /**
   * A text that is only a name, found in the stated state where the gazetteer records no county, farther
   * than this from the town named as the record's county (its seat, as a rule): likely another place of
   * that name, so marked ambiguous for review [CHOICE]; 0 turns the check off. Chosen by measurement on
   * the real-record sets (docs/real-records.md).
   */
  countyReachMeters: 50000,
  /**
   * A text that is only one place name, found as a town the gazetteer does not record as lying in a
   * differently named county or municipality (it records none, or one of its own name): where
   * municipalities tile the land and bear their seat's name, such a label often means the municipality,
   * so the town's radius is widened by this much [CHOICE]; 0 keeps the town's radius. Chosen by
   * measurement on the real-record sets (docs/real-records.md): of 10, 20, 30 and 40 km, 40 km (the
   * value of unitSeatMeters) gave the most covered answers, and no width made a false rate rise.
   */
  bareNameSeatMeters: 40000,
  /**
   * A reference place loaded only outside the record's stated county or state is accepted when it lies
   * within this distance of that unit's polygon, and the remarks say so [CHOICE]: the place a
   * collector measured from is often just across a county line. Common practice, no source. With no
   * polygon of the unit loaded, the distance is estimated from the unit's loaded places (at most the
   * distance to the nearest of them; half of it when the text names the unit the place lies in) and
   * held to the same value (src/locate/just-outside.ts); on the real records (cities only) 10 to 75 km
   * give the same false rates, 25 km and up one more answer (docs/real-records.md). The text's
   * longest offset (its distance and δ) is added: the point, not the town, must lie in the unit (src/locate/namesakes-by-result.ts).
   */
  justOutsideMeters: 25000,
  /**
   * With no polygon of the stated state or county loaded (a gazetteer of towns holds none), how far outside
   * it a reference place loaded only in the next unit lies is told from the unit's own loaded places [CHOICE]:
   * 'nearest place' takes the distance to the nearest place recorded in the unit (that place lies inside, so
   * the line lies nearer: an upper bound, never an understatement); 'halfway' puts the line halfway to it
   * (the expected place of a line known only to lie between them, twice as far reached); 'off' takes no
   * such place (the stated unit a hard wall wherever no polygon is loaded). Whichever is used, a text
   * naming the unit the place lies in puts the line halfway (text and gazetteer agree where the place is),
   * and the remarks give the distance and the place it is measured to. Our choice, no source; measured on
   * the real-record sets (docs/real-records.md, "Issue 11"): on sets 1–3 'halfway' answers nothing more
   * and 'off' one covered answer fewer (set 1, "Near Brasília, federal district", answered by the text's unit).
   */
  unitEdgeByPlaces: 'nearest place' as 'nearest place' | 'halfway' | 'off',
  /**
   * Places sharing a name in a one-place offset text ("10 km N of Santa Rosa", one Santa Rosa in the
   * record's county, another across the line) [CHOICE]: 'result' georeferences each (the exact names
   * kept and those the county's wall dropped within justOutsideMeters + the offset) and takes the one
   * whose circle reaches the record's stated unit; several reaching it make the text ambiguous; none
   * leaves the usual choice. An exact name so beats a near spelling unless its circle misses the unit.
   * 'reference place' judges by where the town lies only. The published method leaves the choice of
   * feature to the georeferencer; our choice, no source; measured on the clean labels (docs/real-records.md, "On clean labels").
   */
  namesakesJudgedBy: 'result' as 'result' | 'reference place',
  /**
   * The text's generic word says a river, lake, mountain, farm, road or park ("Rio X", "Serra Y") and the
   * gazetteer holds only a settlement whose own name begins or ends with a word of that kind [CHOICE]:
   * 'settlement' takes the settlement and says so in the remarks; 'decline' gives no georeference. A
   * settlement that only shares the rest of the name ("Fazenda São Borja" and the town São Borja) is
   * declined either way. Chosen by measurement on the real-record set (docs/real-records.md).
   */
  settlementNamedLikeFeature: 'settlement',
  /**
   * A route between two places with a road kilometre post beside it ("Ipala–Amatillo road, km 12") and no road
   * line loaded [CHOICE]: 12 km from the road's own origin cannot be placed on a straight line honestly, so either
   * the 'route' is answered with its circle (the whole segment and both ends' extents) and the post named as not
   * placed, or the record is declined ('decline'). Chosen by measurement on the real-record sets (docs/real-records.md).
   */
  routeKilometrePost: 'route',
  /**
   * A name matching several features of one type in one state or province, all within this distance of
   * one another (a gazetteer holding one town twice, or two hamlets of one name side by side), is
   * answered with one circle covering them all, as the cover option does, with the remark [CHOICE];
   * farther apart the name stays ambiguous. 0 turns it off. Chosen by measurement on the real-record set
   * (docs/real-records.md).
   */
  namesakesWithinMeters: 30000,
  /**
   * A text that is only a place's name, found in the gazetteer only by a near spelling ("Milbrook" for
   * Millbrook) with nothing else in the text to corroborate it [CHOICE]: 'review' gives no georeference and
   * marks it ambiguous, to be confirmed by a person; 'answer' takes the near spelling, with a remark.
   * A near spelling of a bare name with a town's small radius is a confident circle in the wrong place
   * whenever the spelling names another town. Chosen by measurement on the real-record sets (docs/real-records.md).
   */
  fuzzyLoneName: 'review',
  /**
   * A name found in the gazetteer only as the first word(s) of a longer name ("Redmere" for the town Redmere
   * Springs) [CHOICE]: 'review' gives no georeference and marks it ambiguous, to be confirmed by a person;
   * 'answer' takes the longer name as a near spelling, with a remark. A longer name is most often another place
   * named after the first (a town after its region, lake or range), far from it. Chosen by measurement on the
   * real-record sets (docs/real-records.md). The official long forms "X de <honoree>" are read by
   * honoreeShortForms before this applies.
   */
  nameAsFirstWords: 'review',
  /**
   * A place name found neither as written nor by another documented reading is read as an older
   * spelling of the record's country or the text's language ("Curityba" for Curitiba, "Jalapa" for
   * Xalapa: src/match/older-spelling.ts, the rules of the Portuguese and Spanish reforms) [CHOICE]:
   * 'on' takes such a match as a documented reading, not a near spelling, and the remarks name the
   * rule; 'off' leaves the name to the near-spelling search. Chosen by measurement on the real-record
   * sets (docs/real-records.md).
   */
  olderSpellings: 'on' as 'on' | 'off',
  /**
   * A name found only as the first words of a longer name that is it followed by "de" or "del" and the
   * surname or title of a person honoured, in a Spanish-speaking country ("Texcoco" for Texcoco de Mora,
   * "Jalapa" for Xalapa de Enríquez: an official long form whose town labels call by its own name) [CHOICE]:
   * 'on' reads it as that town, a documented reading named in the remarks, beside (never shadowed by) the
   * towns its older spellings name, and only when no other loaded place of the stated state begins with the
   * name (src/match/short-form.ts); without a stated state, the name as written is read in the stated
   * countries only beside what the older or near spellings find and at no higher a score, so that it is
   * offered to a person and never taken alone ("Xalapa", MX: Xalapa de Enríquez beside the towns Jalapa);
   * 'off' leaves it to the near-spelling search and nameAsFirstWords. Chosen by measurement on the
   * real-record sets (docs/real-records.md).
   */
  honoreeShortForms: 'on' as 'on' | 'off',
  /**
   * A place name found neither as written nor by the readings above, but as a loaded name with the small words
   * joining its parts ("de", "del", "da", "do", "dos", "das", "du", "des", "of", "la") left out, added or changed
   * ("San Manuel Colohete" for San Manuel de Colohete, "Campos de Jordão" for Campos do Jordão) [CHOICE]: 'on'
   * reads it so, only inside a stated country and state and for names of two or more other words, a documented
   * reading named in the remarks (ambiguity and the stated units as for any name; src/match/connector-words.ts;
   * common practice, no source); 'off' leaves it to the near-spelling search. Measured on the real-record sets
   * (docs/real-records.md).
   */
  connectorReadings: 'on' as 'on' | 'off',
  /**
   * A text that is only the record's country's name in another language than the four read throughout
   * (German, Italian or Dutch from CLDR; Latin from memory), written with its own accents ("a Brasilia",
   * Latin for Brazil), names the country, not a town; when a town also bears that name as written or by
   * a documented reading (the capital Brasília) [CHOICE]: 'review' gives no georeference and marks it
   * ambiguous, to be confirmed by a person; 'town' takes the town as any name. The town written with its
   * own accents ("Brasília") is not the country's name and stays the town. Chosen by measurement on the
   * real-record sets (docs/real-records.md).
   */
  countryExonymTown: 'review' as 'review' | 'town',
  /**
   * The record's state or province names no unit the gazetteer loaded, as written or by another of its
   * names ("Labrador", "Aisén Region", "Quezaltenango") [CHOICE]: 'on' reads it as the one loaded unit it
   * names by a looser reading — written with or without spaces, another language's "and", one of the two
   * names a unit joins ("Newfoundland and Labrador"), one letter apart in a name of 5 letters or more
   * (src/match/context.ts looseUnitReading; common practice, no source) — or, with none such, as a unit
   * within the one state where the gazetteer records the towns of that name (a unit is usually named after
   * its seat: "Llanquihue"), and says so in the remarks;
   * 'off' keeps it as written, which walls off every place the gazetteer records in a named unit. Chosen
   * by measurement on the real-record sets (docs/real-records.md).
   */
  statedUnitReadings: 'on' as 'on' | 'off',
  /**
   * The record's state or province written by the former name of a unit since renamed ("Distrito Federal" in
   * Mexico, ISO 3166-2 MX-DIF, now MX-CMX Ciudad de México) [CHOICE]: 'on' reads it as the renamed unit when
   * the gazetteer loads it by a present name, from a small cited table (src/match/former-unit-names.ts), and
   * says so in the remarks; 'off' keeps it as written, which walls off every place recorded in a named unit.
   * Measured on the real-record sets (docs/real-records.md).
   */
  formerUnitNames: 'on' as 'on' | 'off',
  /**
   * A leading clause of a record stating no state that is a name of a state or province in the gazetteer's
   * unit-name table ("US, Colorado, Vail") [CHOICE]: 'on' reads it as that state, context and not a place,
   * when the clause after it names a place the gazetteer records in a state of that name in the record's
   * country, or when no town of the record's country bears its name ("British Columbia"); and the head of a hierarchy ("BOCAS DEL TORO: …", read as a country by its place in the chain)
   * that is no country's name but names the record's stated state by any of its names, or, with none stated, a
   * state of the table holding a place of that name or of the text in the record's country, or one no town of
   * the country is named after, is that state,
   * never a town standing in for the place. 'off' leaves the first a clause to be matched as a place (a town or
   * a near spelling of one) and the second a country-level head whose town may stand in. Common practice, no
   * source; measured on the real-record sets (docs/real-records.md).
   */
  headStateByPlace: 'on' as 'on' | 'off',
  /**
   * A protected area the gazetteer lacks, named after a place the gazetteer holds as a town ("Reserva Biológica de
   * Una": the name after its lead and the words saying which kind of area it is) [CHOICE]: 'of' lets the one town
   * of that name in the stated state stand in for the area when "of" joins the name ("de", "do", "du": the area of
   * a place), after the text's other clauses, widened by unusedFeatureMeters as any place named but not loaded
   * (how far the area reaches from the town is unknown in a gazetteer of towns); 'any' also a name in apposition
   * ("P. N. Alisos", "Alisos Provincial Park": the area's own name, often an honoree's); 'decline' leaves the area
   * unfound. Chosen by measurement on the real-record sets (docs/real-records.md).
   */
  protectedAreaTown: 'of' as 'of' | 'any' | 'decline',
  /**
   * A number before "of the road from" a place ("13.5 da estrada de X", "12 km del camino de X") [CHOICE]: 'from
   * the place' reads it as the distance along that road from the place, where "de X" says the road's count
   * begins (a kilometre post with "km" left out, as Portuguese and Spanish labels write it; with no unit written
   * the number is read between kilometres and miles, unitlessDistanceUnits), and georeferences it as a distance
   * along a path from the place (docs/method.md §3: with no road line loaded, a circle of radius d + δ around it,
   * which holds the point wherever the road bends, since no road is shorter than the straight line); 'decline'
   * gives no georeference, for labels whose roads are counted from elsewhere. Our choice, no source; measured on
   * the real-record sets (docs/real-records.md).
   */
  roadNumberFromPlace: 'from the place' as 'from the place' | 'decline',
  /**
   * A station the gazetteer lacks, named after a place ("Alisos Station", "Estación Alisos", "Estação de Alisos",
   * "Gare de Alisos") [CHOICE]: 'town' lets the one town of that name in the stated state stand in for the
   * station, after the text's other clauses, widened by unusedFeatureMeters as any place named but not loaded
   * (a station named after a town may lie at its edge or kilometres out, and a gazetteer of towns does not
   * say); 'decline' leaves the station unfound. Read as protectedAreaTown reads a park named after a town.
   * Our choice, no source; measured on the real-record sets (docs/real-records.md).
   */
  stationTown: 'town' as 'town' | 'decline',
  /**
   * A clause that is not the record's county as written but a near spelling of it ("Hitamalco" for the county
   * Hueytamalco) [CHOICE]: 'on' reads it as the county, exactly as the county's own name would be read (a
   * county named alone is its seat, unitSeatMeters; a later clause standing in is widened by
   * unusedFeatureMeters), when both are one word of at least 8 letters beginning with the same letter and at most
   * a third of the longer one's letters differ (edits); 'off' reads it only as a place's
   * name. The record's own county corroborates the spelling, as no other name does. Our choice, no source;
   * measured on the real-record sets (docs/real-records.md).
   */
  countyNearSpellings: 'on' as 'on' | 'off',
  /**
   * A text of one to four capitalised words whose words name no place as read ("Country Homes", "Town and Country"
   * read as a country's name, "Woodland" as a habitat, "Forks" as a junction, "Summit" as a word qualifying
   * nothing) [CHOICE]: 'town' reads the whole text as one place's name when the gazetteer holds a settlement of
   * that very name (as written, no other reading, no near spelling) in the record's stated country and state, and
   * georeferences it as any named place; 'word' keeps the reading of its words. A word inside a longer text
   * never matches a town of that word alone ("summit of the ridge", "Forks of the Alisos": no town "Summit",
   * "Forks"). Our choice, no source; measured on the real-record sets and the towns of Washington and Idaho
   * (docs/real-records.md).
   */
  wordNamedTown: 'town' as 'town' | 'word',
  /**
   * "ato" between an offset's place and the place the road leads to ("13.5 da estrada de X ato Y") [CHOICE]:
   * 'até' reads it as the Portuguese "até" (up to, towards), a common typing slip, exactly where "até" is read:
   * the direction of travel, not used for the point; 'as written' declines such a text (the place's name would
   * run on into "ato"). Common practice, no source; measured on the real-record sets (docs/real-records.md).
   */
  typedUpTo: 'até' as 'até' | 'as written',
} as const satisfies Record<string, number | string>;
