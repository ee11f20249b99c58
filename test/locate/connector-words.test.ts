/**
 * A town's name written without the words joining its parts, or with another ("San Manuel Colohete" for San
 * Manuel de Colohete), read as that town only inside a stated country and state ([CHOICE] connectorReadings,
 * src/match/connector-words.ts; common practice, no source). A small invented gazetteer (demo island style,
 * CC0) of towns of the island QV, imported from CSV into a real SQLite file. What is checked is that the
 * reading is named in the remarks, never used silently (Chapman & Wieczorek 2020, Georeferencing Best
 * Practices, §Georeferencing Workflow – Localities, step 5), that it needs the stated state, and that it keeps
 * the ambiguity rule.
 */
import { describe, expect, it } from 'vitest';
import { locate } from '../../src/locate/locate.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { useTownStore } from '../support/csv-store.ts';

// Invented towns: San Telmo de Alisos, Porto das Pedras, and Vila do Mar in two states.
const ROWS = [
  ['t1', 'San Telmo de Alisos', -20.0, -50.0, 'Poniente'],
  ['t2', 'Porto das Pedras', -20.5, -50.5, 'Poniente'],
  ['t3', 'Vila do Mar', -21.0, -49.0, 'Poniente'],
  ['t4', 'Vila do Mar', -21.5, -49.5, 'Levante'],
  ['t5', 'Vila da Mar', -21.2, -49.2, 'Poniente'],
] as const;

const store = useTownStore('connector-words', ROWS);

const remarks = (result: ReturnType<typeof locate>) => result.georeference?.remarks.join('\n') ?? '';

describe('a name without its joining words ([CHOICE] connectorReadings)', () => {
  it('is on by default', () => {
    expect(METHOD_DEFAULTS.connectorReadings).toBe('on');
  });

  it.each([
    // label as written (four languages) / the town it is read as
    ['7 km al noroeste de San Telmo Alisos', 't1', "'san telmo alisos' read as 'san telmo de alisos'"],
    ['7 km NW of San Telmo of Alisos', 't1', "'san telmo of alisos' read as 'san telmo de alisos'"],
    ['7 km a noroeste de Porto de Pedras', 't2', "'porto de pedras' read as 'porto das pedras'"],
    ['à 7 km au nord-ouest de Porto des Pedras', 't2', "'porto des pedras' read as 'porto das pedras'"],
  ])('reads "%s" inside the stated state, and says so', (locality, id, remark) => {
    const result = locate(store(), { locality, countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.features[0]!.featureId).toBe(id);
    expect(remarks(result)).toContain(`${remark}, the words joining its parts left out, added or changed [CHOICE connectorReadings`);
  });

  it('needs a stated state: with the country alone the name is not read so', () => {
    const result = locate(store(), { locality: '7 km al noroeste de San Telmo Alisos', countryCode: 'QV' });
    expect(remarks(result)).not.toContain('connectorReadings');
  });

  it('keeps the ambiguity rule: two towns of the state read so ("Vila Mar") are left for a person', () => {
    const result = locate(store(), { locality: '3 km ao sul de Vila Mar', countryCode: 'QV', stateProvince: 'Poniente' });
    expect(result.status).toBe('ambiguous');
  });

  it('is not tried when the name is found as written, nor when the choice is off', () => {
    const written = locate(store(), { locality: '3 km ao sul de Vila do Mar', countryCode: 'QV', stateProvince: 'Levante' });
    expect(written.georeference!.features[0]!.featureId).toBe('t4');
    expect(remarks(written)).not.toContain('connectorReadings');
    const off = locate(store(), { locality: '7 km al noroeste de San Telmo Alisos', countryCode: 'QV', stateProvince: 'Poniente', options: { connectorReadings: 'off' } });
    expect(remarks(off)).not.toContain('connectorReadings');
  });
});
