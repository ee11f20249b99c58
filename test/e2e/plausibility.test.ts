/**
 * The plausibility checks as a user meets them: the real CLI (locate and batch) and the real service on
 * 127.0.0.1, over a real SQLite file holding the demo gazetteer (the invented island Isla Verdemar, QV,
 * whose country polygon the gazetteer loads). Findings are flags and remarks; the status stays.
 */
import { execFile } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { post, useDemoServer } from '../server/helpers.ts';

const run = promisify(execFile);
const root = new URL('../..', import.meta.url).pathname;
const cli = join(root, 'bin/whereabouts.js');

const demo = useDemoServer();

async function locate(...args: string[]) {
  return JSON.parse((await run(process.execPath, [cli, '--db', demo.db.dbPath, 'locate', ...args, '--json'], { cwd: root })).stdout);
}

describe('whereabouts locate', () => {
  it('flags written coordinates "10°, 10°" on a record from Isla Verdemar as outside its country', async () => {
    const body = await locate('10°, 10°', '--country-code', 'QV');
    expect(body.status).toBe('georeferenced');
    expect(body.flags).toContain('outside-record-country');
    expect(body.darwinCore.georeferenceRemarks).toMatch(/outside the record's country QV \(gazetteer demo:[^)]+\), more than 2,000 km from its outline/);
  });

  it('flags a circle wholly at sea, without refusing it', async () => {
    const body = await locate('45.5 S, 150.2 W', '--country-code', 'QV');
    expect(body.status).toBe('georeferenced');
    expect(body.flags).toEqual(['outside-record-country', 'at-sea']);
    expect(body.darwinCore.georeferenceRemarks).toContain('the whole uncertainty circle lies at sea');
  });

  it('says two clauses that cannot both be right conflict', async () => {
    const body = await locate('5 km N of Puerto Lindo; 3 km S of Vila Serena', '--country-code', 'QV');
    expect(body.flags).toEqual(['clauses-conflict']);
    expect(body.darwinCore.georeferenceRemarks).toMatch(/the clauses "5 km N of Puerto Lindo" and "3 km S of Vila Serena" conflict: their points are \d+ km apart/);
  });

  it('leaves a plausible georeference unflagged', async () => {
    const body = await locate('10 km NE of Vila Serena', '--country-code', 'QV');
    expect(body.flags).toEqual([]);
  });

  it('prints the flags in the reading for a person', async () => {
    const { stdout } = await run(process.execPath, [cli, '--db', demo.db.dbPath, 'locate', '10°, 10°', '--country-code', 'QV'], { cwd: root });
    expect(stdout).toContain('flags: outside-record-country');
  });
});

describe('the service', () => {
  it('returns the flags and remarks in the body of POST /api/v1/georeference', async () => {
    const { status, json } = await post(`${demo.server.url}/api/v1/georeference`, { locality: '5 km N of Puerto Lindo; 3 km S of Vila Serena', countryCode: 'QV' });
    expect(status).toBe(200);
    expect(json.flags).toEqual(['clauses-conflict']);
    expect(json.darwinCore.georeferenceRemarks).toContain('[clauses-conflict]');
    const far = await post(`${demo.server.url}/api/v1/georeference`, { locality: '10°, 10°', countryCode: 'QV' });
    expect(far.json.flags).toContain('outside-record-country');
  });
});

describe('whereabouts batch', () => {
  it('writes the flags in whereabouts_coordinateFlags beside the record\'s own coordinate flags', async () => {
    const input = join(demo.db.dir, 'plausibility.csv');
    const output = join(demo.db.dir, 'plausibility.out.csv');
    writeFileSync(input, [
      'occurrenceID,locality,countryCode,decimalLatitude,decimalLongitude',
      'p1,"10°, 10°",QV,,',
      'p2,"5 km N of Puerto Lindo; 3 km S of Vila Serena",QV,,',
      'p3,"10 km NE of Vila Serena",QV,,',
      'p4,"45.5 S, 150.2 W",QV,0,0',
    ].join('\n'));
    await run(process.execPath, [cli, '--db', demo.db.dbPath, 'batch', input, '--out', output, '--quiet'], { cwd: root });
    const rows = parse(readFileSync(output), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.whereabouts_coordinateFlags)).toEqual([
      'outside-record-country',
      'clauses-conflict',
      '',
      'outside-record-country | at-sea | both-zero | outside-locality-circle',
    ]);
  });
});
