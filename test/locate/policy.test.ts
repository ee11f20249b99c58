/**
 * The locate policy on the demo gazetteer (invented, CC0; gazetteer/README.md), through `locate` over a
 * real SQLite file. What is checked is the method's workflow rule that a feature is never used silently
 * when the text says more than the feature can carry (Chapman & Wieczorek 2020, Georeferencing Best
 * Practices, §Georeferencing Workflow – Localities, step 5: do not georeference what the clauses do not
 * support), with each [CHOICE] of src/georef/method-defaults.ts cited in the remarks or the reason.
 * Distances between demo features by Vincenty (geodesy 2.4.0), independent of the code under test.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { FUZZY_ACCEPTANCE, locate } from '../../src/locate/locate.ts';
import { findUnit, seatNames, unitNamed } from '../../src/locate/administrative-unit.ts';
import { foldName } from '../../src/match/fold.ts';
import { judgeKind } from '../../src/locate/feature-kind.ts';
import { parseLocality, type Interpretation } from '../../src/parse/index.ts';

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-policy-'));
let store: GazetteerStore;

beforeAll(async () => {
  const db = join(directory, 'demo.sqlite');
  const writer = openGazetteer(db);
  await importGazetteer(writer, new URL('../../gazetteer/demo.geojson', import.meta.url).pathname, { format: 'geojson', citation: 'demo (invented)' });
  writer.close();
  store = openGazetteer(db, { readonly: true });
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

const PUERTO_LINDO_RADIUS = 3500; // demo-places.csv, qv-0013

/** The georeference of a demo text that must be answered, with the feature ids it rests on and its widening term. */
function answered(locality: string, fields: { stateProvince?: string; county?: string }) {
  const result = locate(store, { locality, countryCode: 'QV', ...fields });
  expect(result.status, result.reason).toBe('georeferenced');
  const g = result.georeference!;
  return { featureIds: g.features.map((f) => f.featureId), widened: g.components.unusedFeature, remarks: g.remarks.join('\n') };
}

describe('an administrative unit is georeferenced as the unit, never as a town', () => {
  it.each([
    ['Alisos', { county: 'Alisos' }, 'qv-0005', 'county'],
    ['Poniente', { stateProvince: 'Poniente' }, 'qv-0002', 'state or province'],
    ['Isla Verdemar', { country: 'Isla Verdemar' }, 'qv-0001', 'country'],
  ])('"%s", equal to the record\'s own unit, by that unit\'s polygon', (locality, fields, featureId, words) => {
    const result = locate(store, { locality, countryCode: 'QV', ...fields });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual([featureId]);
    expect(result.georeference!.remarks.join('\n')).toContain(`names the ${words} "${locality}": georeferenced as that unit by its polygon`);
  });

  it('reads the record\'s country named in any of the four languages as the country ("Brasil" for BR)', () => {
    // Country names from the CLDR region names that Node's Intl carries; no Brazil polygon is loaded.
    const result = locate(store, { locality: 'Brasil', countryCode: 'BR' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/"Brasil" names the country "Brasil", not a place/);
  });

  it('declines a unit whose polygon is not loaded, and says why ([CHOICE] unitWithoutPolygon)', () => {
    // "Puerto Lindo" as the record's county: no county polygon of that name, only the city.
    const result = locate(store, { locality: 'Puerto Lindo', countryCode: 'QV', county: 'Puerto Lindo' });
    expect(METHOD_DEFAULTS.unitWithoutPolygon).toBe('decline');
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/names the county "Puerto Lindo", not a place; no polygon of it is loaded \[CHOICE unitWithoutPolygon/);
  });

  it('takes a county named alone, with no polygon loaded, at its seat in the stated state, widened by the unit\'s default extent ([CHOICE] unitSeatMeters)', () => {
    // "Puerto Lindo" as the record's county in Poniente: no county polygon of that name; the city qv-0013 is its seat.
    const result = locate(store, { locality: 'Puerto Lindo', countryCode: 'QV', stateProvince: 'Poniente', county: 'Puerto Lindo' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['qv-0013']);
    expect(result.components!.unusedFeature).toBe(METHOD_DEFAULTS.unitSeatMeters);
    expect(result.georeference!.uncertaintyMeters).toBeGreaterThanOrEqual(PUERTO_LINDO_RADIUS + METHOD_DEFAULTS.unitSeatMeters);
    expect(result.georeference!.remarks.join('\n')).toMatch(/names the county "Puerto Lindo", whose polygon is not loaded: georeferenced at its seat.*\[CHOICE unitSeatMeters/);
  });

  it.each([
    ['Valle Hondo', 'Valle Hondo de Alcántara'],
    ['Valle Hondo de Alcántara', 'VALLE HONDO DE ALCANTARA'],
    ['VALLE HONDO', 'Valle Hondo'],
  ])('takes "%s" for the county "%s" at its seat, the town Valle Hondo: an official long form "X de <honoree>" is matched by its short form X', (locality, county) => {
    // Invented honoree; qv-0026 Valle Hondo is a town of Poniente, and no county polygon of either form is loaded.
    const g = answered(locality, { stateProvince: 'Poniente', county });
    expect(g.featureIds).toEqual(['qv-0026']);
    expect(g.widened).toBe(METHOD_DEFAULTS.unitSeatMeters);
    expect(g.remarks).toMatch(/georeferenced at its seat, .*\[CHOICE unitSeatMeters/);
    if (foldName(county) !== foldName('Valle Hondo')) expect(g.remarks).toContain('the town "Valle Hondo", the county\'s name without the "de <honoree>" of its official long form');
  });

  it('tries the unit\'s name, the name as written, then its short form, each once', () => {
    expect(seatNames({ name: 'VALLE HONDO DE ALCANTARA', level: 'county', written: 'Valle Hondo de Alcántara' })).toEqual(['VALLE HONDO DE ALCANTARA', 'valle hondo']);
    expect(seatNames({ name: 'Valle Hondo de Alcántara', level: 'county', written: 'Valle Hondo' })).toEqual(['Valle Hondo de Alcántara', 'Valle Hondo']);
    expect(seatNames({ name: 'Alisos', level: 'county', written: 'ALISOS' })).toEqual(['Alisos']);
  });

  it('leaves a bare name found only by a near spelling for a person to confirm ([CHOICE] fuzzyLoneName)', () => {
    const result = locate(store, { locality: 'Milbrook', countryCode: 'QV', stateProvince: 'Côte-du-Levant' });
    expect(METHOD_DEFAULTS.fuzzyLoneName).toBe('review');
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/the only near spelling, Millbrook .* left for a person to confirm \[CHOICE fuzzyLoneName/);
    // With an offset the near spelling is still taken, with its remark: the rule is for a bare name only.
    expect(locate(store, { locality: '5 km N of Milbrook', countryCode: 'QV', stateProvince: 'Côte-du-Levant' }).status).toBe('georeferenced');
  });

  it('takes the parser\'s administrative-unit reading as the unit ("Município de Serrana")', () => {
    const interpretation: Interpretation = {
      ...parseLocality('Serrana'),
      type: 'administrative-unit',
      features: ['Serrana'],
      unit: { name: 'Serrana', level: 'county', written: 'Município de Serrana' },
    };
    const unit = unitNamed(interpretation, { countryCode: 'QV' });
    expect(unit).toEqual({ name: 'Serrana', level: 'county', written: 'Município de Serrana' });
    const found = findUnit(store, unit!, { countryCode: 'QV' }, FUZZY_ACCEPTANCE.readingScore);
    expect(found.feature?.featureType).toBe('county');
    expect(found.feature?.geometryType).toMatch(/Polygon/);
  });
});

describe('a place the text names but the gazetteer lacks', () => {
  it('widens the radius by the [CHOICE] distance and says so ("Puerto Lindo, Laguna Negra", no such lake)', () => {
    const result = locate(store, { locality: 'Puerto Lindo, Laguna Negra', countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(g.uncertaintyMeters).toBeCloseTo(PUERTO_LINDO_RADIUS + METHOD_DEFAULTS.unusedFeatureMeters, 6);
    expect(g.remarks.join('\n')).toMatch(/"Laguna Negra" is named but not in the loaded gazetteers.*\[CHOICE unusedFeatureMeters/);
  });

  it('declines instead when the rule is set to decline', () => {
    const result = locate(store, { locality: 'Puerto Lindo, Laguna Negra', countryCode: 'QV', options: { unusedFeatureRule: 'decline' } });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/"Laguna Negra" is named but not in the loaded gazetteers.*\[CHOICE unusedFeatureRule 'decline'/);
  });

  it('keeps the town\'s radius when the other clause is the record\'s own unit', () => {
    const result = locate(store, { locality: 'Puerto Lindo, Poniente', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.components.unusedFeature).toBeUndefined();
  });

  it('declines when another clause names a loaded place far from the answer', () => {
    // Laguna Azul lies 51 km from Puerto Lindo: one text cannot mean both.
    const result = locate(store, { locality: 'Puerto Lindo, Laguna Azul', countryCode: 'QV' });
    expect(result.status).toBe('unparseable');
    expect(result.reason).toMatch(/also names "Laguna Azul", \d+ km from the answer's center.*the clauses disagree/);
  });
});

describe('a later clause names the findable place', () => {
  it('falls back to it, widened, when the first is missing ("Villa Quimera, Puerto Lindo")', () => {
    const result = locate(store, { locality: 'Villa Quimera, Puerto Lindo', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features[0]!.featureId).toBe('qv-0013');
    expect(g.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(g.remarks.join('\n')).toMatch(/"Villa Quimera" is not in the loaded gazetteers: the next clause, "Puerto Lindo", is used instead/);
  });

  it('reads a place named before "near" as its own clause, so "near" the findable place stands in, widened ("Villa Quimera near Puerto Lindo", four languages)', () => {
    // Common practice, no source: no place's name holds "near"; the text reads as "Villa Quimera, near Puerto Lindo".
    for (const locality of ['Villa Quimera near Puerto Lindo', 'Villa Quimera cerca de Puerto Lindo', 'Villa Quimera perto de Puerto Lindo', 'Villa Quimera près de Puerto Lindo']) {
      const g = answered(locality, { stateProvince: 'Poniente' });
      expect(g.featureIds[0], locality).toBe('qv-0013');
      expect(g.widened, locality).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
      expect(g.remarks, locality).toMatch(/"Villa Quimera" is named but not in the loaded gazetteers/);
    }
  });

  it('reads two offsets from two places joined by "and" as two clauses: the second stands in when the first place is missing ("1 air mi NE of Villa Quimera and 11 air mi SE of Puerto Lindo")', () => {
    const g = answered('ca 1 air mi NE of Villa Quimera and ca 11 air mi SE of Puerto Lindo', { stateProvince: 'Poniente' });
    expect(g.featureIds[0]).toBe('qv-0013');
    expect(g.remarks).toMatch(/"Villa Quimera" is not in the loaded gazetteers: the next clause, "ca 11 air mi SE of Puerto Lindo", is used instead/);
  });

  it('takes a unit named in the later clause by its polygon, with no term added ("Cerro Azul, Alisos")', () => {
    const result = locate(store, { locality: 'Cerro Azul, Alisos', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features[0]!.featureId).toBe('qv-0005');
    expect(g.components.unusedFeature).toBeUndefined();
    expect(g.remarks.join('\n')).toMatch(/"Cerro Azul" is named but not in the loaded gazetteers; the text places it in the county "Alisos", whose polygon is the answer's extent/);
  });

  it('falls back to it, widened, when the first names a farm the gazetteer holds only as a town of that name ("Estancia Puerto Lindo, Santa Rosa")', () => {
    // qv-0013 Puerto Lindo is a city, not the estate; qv-0015 Santa Rosa is a town in Poniente.
    const g = answered('Estancia Puerto Lindo, Santa Rosa', { stateProvince: 'Poniente' });
    expect(g.featureIds[0]).toBe('qv-0015');
    expect(g.widened).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(g.remarks).toMatch(/"Estancia Puerto Lindo" is not in the loaded gazetteers as a farm or estate, only as a settlement that shares its name: the next clause, "Santa Rosa", is used instead/);
    expect(g.remarks).toMatch(/"Estancia Puerto Lindo" \(as a farm or estate\) is named but not in the loaded gazetteers.*\[CHOICE unusedFeatureMeters/);
    // Alone, or without a stated state or county, it is declined as before.
    expect(locate(store, { locality: 'Estancia Puerto Lindo', countryCode: 'QV', stateProvince: 'Poniente' }).reason).toMatch(/names a farm or estate; the gazetteer's "Puerto Lindo" .* shares the name/);
    expect(locate(store, { locality: 'Estancia Puerto Lindo, Santa Rosa', countryCode: 'QV' }).status).toBe('not-found');
  });

  it('does not fall back without a stated state or county (a name met anywhere is too often another place)', () => {
    const result = locate(store, { locality: 'Villa Quimera, Puerto Lindo', countryCode: 'QV' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/Villa Quimera/);
  });
});

describe('a second name written in brackets ("X (Y)": an older or other name of the same place)', () => {
  it('is used when the first name is not found, as the same place: the place\'s own radius, no widening', () => {
    const g = answered('Puerto Nada (Santa Rosa)', { stateProvince: 'Poniente' });
    expect(g.featureIds[0]).toBe('qv-0015');
    expect(g.widened).toBeUndefined();
    expect(g.remarks).toMatch(/"Puerto Nada" is not in the loaded gazetteers: its second name written in brackets, "Santa Rosa", is used/);
  });

  it('is not tried when the first name is found', () => {
    const g = answered('Puerto Lindo (Santa Rosa)', { stateProvince: 'Poniente' });
    expect(g.featureIds[0]).toBe('qv-0013');
    expect(g.remarks).not.toMatch(/is used/);
  });

  it('is the record\'s unit, not a second name, when it names the record\'s county: a stand-in, as a later clause would be', () => {
    const g = answered('Villa Quimera (Alisos)', { stateProvince: 'Poniente', county: 'Alisos' });
    expect(g.featureIds[0]).toBe('qv-0005');
    expect(g.remarks).toMatch(/"Villa Quimera" is not in the loaded gazetteers: the record's unit written in brackets, "Alisos", is used instead/);
  });

  it('lets a later clause stand in under its second name, widened for the missing first place', () => {
    const g = answered('Cerro Azul, Puerto Nada (Santa Rosa)', { stateProvince: 'Poniente' });
    expect(g.featureIds[0]).toBe('qv-0015');
    expect(g.widened).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(g.remarks).toMatch(/"Cerro Azul" is named but not in the loaded gazetteers/);
  });
});

describe('the stated units are a soft wall', () => {
  it('takes a reference place just outside the stated county, and says so ([CHOICE] justOutsideMeters)', () => {
    // Las Garzas (Tres Cruces) lies 8.7 km outside county Alisos; 10 km N of it reaches into Alisos.
    // Allowed: 25 km + the offset, 10 km + δ 0.5 km (Chapman & Wieczorek 2020, offset precision table) = 35.5 km.
    const result = locate(store, { locality: '10 km N of Las Garzas', countryCode: 'QV', county: 'Alisos' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.remarks[0]).toMatch(/"Las Garzas" is not inside the record's county "Alisos" .* but lies 8\.7 km outside it: accepted, within the 36 km allowed \[CHOICE justOutsideMeters/);
  });

  it('lets the allowance grow with the offset: the point, not the town, must lie in the county', () => {
    // El Molino (Cerrillos) lies 28.2 km outside Alisos: refused as a bare name (below), taken 30 km NW of it
    // (25 km + 30 km + δ 0.5 km), the answer's circle reaching into Alisos.
    const result = locate(store, { locality: '30 km NW of El Molino', countryCode: 'QV', county: 'Alisos' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.remarks[0]).toMatch(/"El Molino" .* lies 28\.2 km outside it: accepted, within the 56 km allowed/);
  });

  it('refuses a place farther out than the allowance, naming it', () => {
    // El Molino (Cerrillos) lies 28.2 km outside county Alisos.
    const result = locate(store, { locality: 'El Molino', countryCode: 'QV', county: 'Alisos' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/"El Molino" is loaded only outside county "Alisos": El Molino \(demo:qv-0029;.*none lies within 25 km of it/);
  });

  it('still refuses an answer wholly outside the stated unit', () => {
    const result = locate(store, { locality: '10 km S of Las Garzas', countryCode: 'QV', county: 'Alisos' });
    expect(result.status).toBe('unparseable');
    expect(result.reason).toMatch(/wholly outside the bounding unit "Alisos"/);
  });
});

describe('places sharing a name are judged by where the answer lands ([CHOICE] namesakesJudgedBy)', () => {
  // Two San Telmo in the demo gazetteer: a village in Rio Fundo (qv-0062) and a town in Cerrillos (qv-0027).
  it('takes the namesake whose answer reaches the record\'s county, and says so', () => {
    const result = locate(store, { locality: '10 km W of San Telmo', countryCode: 'QV', county: 'Rio Fundo' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toContain('qv-0062');
    expect(result.georeference!.remarks[0]).toMatch(/"San Telmo": San Telmo \(demo:qv-0062, Rio Fundo\) taken, the only one of 2 place\(s\) .* whose answer's circle reaches it \[CHOICE namesakesJudgedBy/);
  });

  it('calls the text ambiguous when both answers reach the county, though one town lies outside it', () => {
    const result = locate(store, { locality: '13 km E of San Telmo', countryCode: 'QV', county: 'Rio Fundo' });
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/2 places of that name give points whose circles reach the record's county "Rio Fundo": San Telmo \(demo:qv-0062, Rio Fundo\); San Telmo \(demo:qv-0027, Cerrillos\)/);
    // Judged by the reference place only, the town inside the county is taken, as before.
    expect(locate(store, { locality: '13 km E of San Telmo', countryCode: 'QV', county: 'Rio Fundo', options: { namesakesJudgedBy: 'reference place' } }).status).toBe('georeferenced');
  });

  it('judges namesakes that both lie outside the county the same way', () => {
    // Bellevue: a hamlet in Serrana (qv-0052) and a village in Haut-Levant (qv-0075), neither in Rio Fundo.
    const result = locate(store, { locality: '10 km SW of Bellevue', countryCode: 'QV', county: 'Rio Fundo' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toContain('qv-0052');
  });

  it('reads the record\'s own county as context, not as the place measured from', () => {
    // Rio Fundo is a county (qv-0009), a town in it (qv-0061) and a river (qv-0161): with county Rio Fundo
    // the county leaves the choice; the town and the river still make the text ambiguous.
    const result = locate(store, { locality: '10 km W of Rio Fundo', countryCode: 'QV', county: 'Rio Fundo' });
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/qv-0061/);
    expect(result.reason).toMatch(/qv-0161/);
    expect(result.reason).not.toMatch(/qv-0009/);
  });

  it('prefers the exact name outside the county to a near spelling inside it when the answer reaches the county', () => {
    // Las Dunas (qv-0126, Tres Cruces) written exactly; Las Tunas (qv-0020) lies in Alisos, one letter off.
    const result = locate(store, { locality: '19 km NW of Las Dunas', countryCode: 'QV', county: 'Alisos' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toContain('qv-0126');
    expect(result.georeference!.remarks[0]).toMatch(/preferred to the near spelling "Las Tunas" inside it/);
  });
});

describe('one weak near name is not "ambiguous"', () => {
  it('reports a lone near name below the acceptance score as not found, naming it', () => {
    // "Valle Hondito": its one near name, Valle Hondo, scores 0.79, under the 0.8 a lone match needs.
    const result = locate(store, { locality: 'Valle Hondito', countryCode: 'QV' });
    expect(result.status).toBe('not-found');
    expect(result.reason).toMatch(/no feature named "Valle Hondito".*the only near name, Valle Hondo .*score 0\.79\), scores below the 0\.8 a lone near match needs/);
  });

  it('keeps "ambiguous" for two equally near names', () => {
    const result = locate(store, { locality: 'Santa Rosita', countryCode: 'QV' });
    expect(result.status).toBe('ambiguous');
    expect(result.reason).toMatch(/matches several features: Santa Rosa .*; Santa Rosa/);
  });
});

describe('distances the cases above rest on (Vincenty, geodesy 2.4.0)', () => {
  it('Laguna Azul is far from Puerto Lindo, beyond both radii', () => {
    const lindo = store.findCandidates({ name: 'Puerto Lindo', context: { countryCode: 'QV' } })[0]!.feature;
    const lake = store.findCandidates({ name: 'Laguna Azul', context: { countryCode: 'QV' } })[0]!.feature;
    const d = new LatLon(lindo.latitude, lindo.longitude).distanceTo(new LatLon(lake.latitude, lake.longitude));
    expect(d).toBeGreaterThan(lindo.radiusMeters + lake.radiusMeters);
  });
});

describe('what the text says a place is', () => {
  it('declines a town for a farm that shares its name', () => {
    const town = store.findCandidates({ name: 'Puerto Lindo', context: { countryCode: 'QV' } })[0]!.feature;
    expect(judgeKind('farm', 'Estancia Puerto Lindo', town, 'settlement')).toEqual({ decline: expect.stringMatching(/"Estancia Puerto Lindo" names a farm or estate; the gazetteer's "Puerto Lindo" \(city, demo:qv-0013\) is a settlement that shares the name/), missing: 'as a farm or estate' });
    expect(judgeKind('populated-place', 'Puerto Lindo', town, 'settlement')).toBeNull();
    expect(judgeKind(undefined, 'Puerto Lindo', town, 'settlement')).toBeNull();
  });

  it('keeps a farm for a farm', () => {
    const farm = store.findCandidates({ name: 'Fazenda Boa Vista', context: { countryCode: 'QV' } })[0]!.feature;
    expect(farm.featureType).toBe('farm');
    expect(judgeKind('farm', 'Fazenda Boa Vista', farm, 'settlement')).toBeNull();
  });

  it('takes a town whose own name carries the generic word, and says so, unless the [CHOICE] declines', () => {
    // demo-places.csv qv-0061: the town Rio Fundo, named like the river qv-0161.
    const town = store.findCandidates({ name: 'Rio Fundo', context: { countryCode: 'QV' }, featureTypes: ['town'] })[0]!.feature;
    expect(town.featureId).toBe('qv-0061');
    expect(METHOD_DEFAULTS.settlementNamedLikeFeature).toBe('settlement');
    expect(judgeKind('stream', 'rio Fundo', town, 'settlement')).toEqual({ remark: expect.stringMatching(/"rio Fundo" may name a river or stream; the gazetteer's "Rio Fundo" \(town, demo:qv-0061\) is a settlement of that very name .*\[CHOICE settlementNamedLikeFeature/) });
    expect(judgeKind('stream', 'rio Fundo', town, 'decline')).toEqual({ decline: expect.stringMatching(/names a river or stream/), missing: 'as a river or stream' });
  });
});

describe('clauses that give context or stand in (method workflow step 5: the most specific clause the gazetteers support)', () => {
  it('reads a leading clause that names the record\'s own state as context, and uses the clause after it', () => {
    const result = locate(store, { locality: 'Serra Alta, Vila Serena', countryCode: 'QV', stateProvince: 'Serra Alta' });
    expect(result.status).toBe('georeferenced');
    // The place, then the stated state that bounds it.
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['qv-0048', 'qv-0003']);
    expect(result.interpretation.notes.join('\n')).toContain('"Serra Alta" names the record\'s state or province: read as context, the clause after it used');
    expect(result.interpretation.notes.join('\n')).not.toContain('also named: "Vila Serena"');
  });

  it('reads clauses written with periods as a hierarchy when they are the record\'s own units ("Isla Verdemar. Poniente. Puerto Lindo")', () => {
    const result = locate(store, { locality: 'Isla Verdemar. Poniente. Puerto Lindo', countryCode: 'QV', country: 'Isla Verdemar', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['qv-0013', 'qv-0002']);
    expect(result.georeference!.components.unusedFeature).toBeUndefined();
    expect(result.interpretation.notes.join('\n')).toContain('"Isla Verdemar" names the record\'s country: read as context, the clause after it used');
  });

  it('reads a leading clause the gazetteer holds as a unit of the record\'s country as context when only the country code is given ("Isla Verdemar. Poniente. Puerto Lindo")', () => {
    for (const locality of ['Isla Verdemar. Poniente. Puerto Lindo', 'Verdemar, Poniente, Puerto Lindo', 'Poniente. Puerto Lindo']) {
      const result = locate(store, { locality, countryCode: 'QV' });
      expect(result.status, locality).toBe('georeferenced');
      // The town (qv-0013), bounded by the province the text names (qv-0002), not the 78 km country polygon.
      expect(result.georeference!.features.map((f) => f.featureId), locality).toEqual(['qv-0013', 'qv-0002']);
      expect(result.interpretation.notes.join('\n'), locality).toContain('names the loaded gazetteer\'s state or province "Poniente", in the record\'s country: read as context, the clause after it used');
    }
  });

  it('bounds the place by the province a gazetteer-found head names: a town of another province is a contradiction, not an answer', () => {
    const result = locate(store, { locality: 'Isla Verdemar, Serra Alta, Puerto Lindo', countryCode: 'QV' });
    expect(result.status).not.toBe('georeferenced');
  });

  it('keeps a unit named after a narrower one as the answer: no more specific clause follows ("Poniente, Isla Verdemar")', () => {
    const result = locate(store, { locality: 'Poniente, Isla Verdemar', countryCode: 'QV' });
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['qv-0002']);
  });

  it('never takes period-separated places that head no hierarchy as context: missing, they widen the answer ("Reserva Nunca Vista. Cordillera Nunca Vista. Puerto Lindo.")', () => {
    const result = locate(store, { locality: 'Reserva Nunca Vista. Cordillera Nunca Vista. Puerto Lindo.', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features[0]!.featureId).toBe('qv-0013');
    expect(g.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(g.uncertaintyMeters).toBeCloseTo(PUERTO_LINDO_RADIUS + METHOD_DEFAULTS.unusedFeatureMeters, 6);
  });

  it('lets the record\'s county, written as a leading clause, stand in by its town when the place after it is not loaded', () => {
    const result = locate(store, { locality: 'Alisos. Fazenda Nunca Vista', countryCode: 'QV', county: 'Alisos' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['qv-0005']);
    expect(result.interpretation.notes.join('\n')).toContain('the town of the county the text names, "Alisos", is used instead');
  });

  it('uses the town of a municipality the text names when no place of the text is loaded, widened by [CHOICE] unusedFeatureMeters', () => {
    const result = locate(store, { locality: 'Mun. Vila Serena: Fazenda Nunca Vista', countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features.map((f) => f.featureId)).toEqual(['qv-0048']);
    expect(g.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(result.interpretation.notes.join('\n')).toContain('the town of the municipality the text names, "Vila Serena", is used instead');
  });

  it('uses the place written at the head of a hierarchy when it is no country name ("Vila Serena: Fazenda …")', () => {
    const result = locate(store, { locality: 'Vila Serena: Fazenda Nunca Vista', countryCode: 'QV', stateProvince: 'Serra Alta' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe('qv-0048');
    expect(result.georeference!.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(result.interpretation.notes.join('\n')).toContain('the place the text writes at the head of its hierarchy, "Vila Serena", is used instead');
  });

  it('lets a later clause stand in when its name is found by a documented reading ("Sn." for San)', () => {
    const result = locate(store, { locality: 'Cerro Nunca Visto, Sn. Telmo', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features.map((f) => f.featureId)).toEqual(['qv-0027', 'qv-0002']);
    expect(result.georeference!.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
  });

  it('covers namesakes of one type in one province with one circle only within [CHOICE] namesakesWithinMeters', () => {
    // demo-places.csv: Los Pinos qv-0016 and qv-0039, both villages of Poniente.
    const request = { locality: 'Los Pinos', countryCode: 'QV', stateProvince: 'Poniente' };
    const a = new LatLon(-45.06327, -131.21675);
    const b = new LatLon(-45.687422, -131.67846);
    const apart = a.distanceTo(b); // Vincenty, geodesy 2.4.0: about 77 km
    expect(apart).toBeGreaterThan(METHOD_DEFAULTS.namesakesWithinMeters);
    expect(locate(store, request).status).toBe('ambiguous');
    const covered = locate(store, { ...request, options: { namesakesWithinMeters: 100000 } });
    expect(covered.status).toBe('georeferenced');
    const g = covered.georeference!;
    const center = new LatLon(g.latitude, g.longitude);
    for (const point of [a, b]) expect(center.distanceTo(point)).toBeLessThanOrEqual(g.uncertaintyMeters);
    expect(g.remarks.join('\n')).toMatch(/"Los Pinos" matches 2 features within 100 km of each other .*\[CHOICE namesakesWithinMeters/);
  });
});
