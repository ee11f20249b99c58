/**
 * A Spanish, a Portuguese and a French label of every locality type, georeferenced end to end through
 * the real CLI (`whereabouts batch`) against the demo gazetteer in a temporary SQLite file. Label
 * conventions per language are those of the parser's corpus (test/fixtures/parse); the places are the
 * invented ones of gazetteer/demo.geojson.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import { beforeAll, describe, expect, it } from 'vitest';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-languages-'));
const db = join(dir, 'demo.sqlite');

/** [language, locality type, label, county of the record (bounds a heading alone)] */
const labels: [string, string, string, string][] = [
  ['es', 'named-place', 'Valle Hondo', ''],
  ['es', 'offset-heading', 'ca. 10 km al NE de Valle Hondo', ''],
  ['es', 'offset-orthogonal', '3 km al N y 2 km al E de Valle Hondo', ''],
  ['es', 'distance-only', 'a 5 km de Valle Hondo', ''],
  ['es', 'offset-path', '12 km por la Ruta 12 desde Puerto Lindo', ''],
  ['es', 'heading-only', 'al N de Valle Hondo', 'Cerrillos'],
  ['es', 'between', 'entre Valle Hondo y Villa Alisos', ''],
  ['es', 'near', 'cerca de Valle Hondo', ''],
  ['es', 'junction', 'confluencia del Río Claro y Arroyo Negro', ''],
  ['es', 'coordinates', "45°36'S 131°25'O", ''],
  ['pt', 'named-place', 'Vila Serena', ''],
  ['pt', 'offset-heading', '10 km a NE de Vila Serena', ''],
  ['pt', 'offset-orthogonal', '3 km ao N e 2 km a L de Vila Serena', ''],
  ['pt', 'distance-only', 'a 5 km de Vila Serena', ''],
  ['pt', 'offset-path', '8 km pela estrada de Vila Serena', ''],
  ['pt', 'heading-only', 'ao N de Vila Serena', 'Serrana'],
  ['pt', 'between', 'entre Vila Serena e Porto Novo', ''],
  ['pt', 'near', 'perto de Vila Serena', ''],
  ['pt', 'junction', 'confluência do Rio Fundo e Ribeirão das Pedras', ''],
  ['pt', 'coordinates', "45°18'S 131°00'O", ''],
  ['fr', 'named-place', 'Saint-Aubrac', ''],
  ['fr', 'offset-heading', 'à 10 km au NE de Saint-Aubrac', ''],
  ['fr', 'offset-orthogonal', "3 km au N et 2 km à l'E de Saint-Aubrac", ''],
  ['fr', 'distance-only', 'à 5 km de Saint-Aubrac', ''],
  ['fr', 'offset-path', '8 km par la route de Saint-Aubrac', ''],
  ['fr', 'heading-only', 'au N de Saint-Aubrac', 'Haut-Levant'],
  ['fr', 'between', 'entre Saint-Aubrac et Beaulieu', ''],
  ['fr', 'near', 'près de Saint-Aubrac', ''],
  ['fr', 'junction', 'confluent de la Rivière Blanche et du Ruisseau des Saules', ''],
  ['fr', 'coordinates', "45°40'S 130°30'O", ''],
];

let output: Record<string, string>[];

beforeAll(async () => {
  const cli = join(root, 'bin/whereabouts.js');
  await run(process.execPath, [cli, '--db', db, 'import', 'gazetteer/demo.geojson', '--source', 'demo (invented)'], { cwd: root });
  const input = join(dir, 'labels.csv');
  writeFileSync(input, stringify([['occurrenceID', 'locality', 'countryCode', 'county'], ...labels.map(([lang, type, text, county]) => [`${lang}-${type}`, text, 'QV', county])]));
  const out = join(dir, 'labels-out.csv');
  await run(process.execPath, [cli, '--db', db, 'batch', input, '--out', out, '--quiet'], { cwd: root });
  output = parse(readFileSync(out), { columns: true }) as Record<string, string>[];
}, 120_000);

describe('labels in three languages, every locality type, through the CLI', () => {
  it.each(labels)('%s %s: %s', (lang, type) => {
    const row = output.find((r) => r.occurrenceID === `${lang}-${type}`)!;
    expect(row.georeferenceVerificationStatus, row.georeferenceRemarks).toBe('requires verification');
    expect(row.georeferenceRemarks).toContain(`locality type "${type}"`);
    expect(Number(row.coordinateUncertaintyInMeters)).toBeGreaterThan(0);
  });
});
