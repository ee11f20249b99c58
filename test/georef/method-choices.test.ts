/**
 * The list of choices is whole and true: every file of src/ that carries a [CHOICE] marker is named by some
 * entry, and every value equals the one in force (METHOD_DEFAULTS or the constant the code uses). The sources
 * cited are those of docs/method.md; here the check is against the code itself, so none can be added silently.
 */
import { execFile } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { methodChoices, methodChoiceValues } from '../../src/georef/method-choices.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { FUZZY_ACCEPTANCE, MAX_COVERED_READINGS } from '../../src/locate/locate.ts';
import { DEFAULT_PORT } from '../../src/cli/commands/serve.ts';
import { MAX_PARTS } from '../../src/batch/partition.ts';
import { MAX_ROW_CHARACTERS } from '../../src/batch/records.ts';
import { CENTER_TOLERANCE_METERS } from '../../src/record/coordinate-check.ts';
import { RECORDS_LIMITS } from '../../src/server/routes/records.ts';
import { SERVER_DEFAULTS } from '../../src/server/defaults.ts';
import { DISTANCE_LIMITS } from '../../src/georef/generalisation.ts';
import { METER_GRID_LIMITS } from '../../src/georef/meter-grid-generalisation.ts';
import { SENSITIVE_TAXA_LIMIT } from '../../src/server/generalisation-request.ts';

const root = new URL('../..', import.meta.url).pathname;

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? filesUnder(join(dir, e.name)) : [join(dir, e.name)]));
}

describe('method choices', () => {
  const choices = methodChoices();
  const byId = new Map(choices.map((c) => [c.id, c]));

  it('names every file of src/ that carries a [CHOICE] marker', () => {
    const marked = filesUnder(join(root, 'src')).filter((f) => f.endsWith('.ts') && readFileSync(f, 'utf8').includes('[CHOICE'));
    const named = new Set(choices.flatMap((c) => c.where));
    // The list itself and the verb that prints it name the marker without being a choice.
    const describing = new Set(['src/georef/method-choices.ts', 'src/cli/commands/method.ts']);
    const missing = marked.map((f) => relative(root, f)).filter((f) => !named.has(f) && !describing.has(f));
    expect(missing).toEqual([]);
    for (const c of choices) for (const f of c.where) expect(readFileSync(join(root, f), 'utf8'), `${c.id}: ${f}`).toMatch(/\[CHOICE|MethodOptions|METHOD_DEFAULTS/);
  });

  it('lists every key of METHOD_DEFAULTS with the value in force', () => {
    for (const [key, value] of Object.entries(METHOD_DEFAULTS)) expect(byId.get(key)?.value, key).toBe(value);
  });

  it('states the value of each constant the code uses', () => {
    expect(byId.get('maxCoveredReadings')!.value).toBe(MAX_COVERED_READINGS);
    const f = FUZZY_ACCEPTANCE;
    expect(byId.get('fuzzyAcceptance')!.value).toBe(`${f.plausibleScore}, ${f.minimumScore}, ${f.minimumLead}, ${f.readingScore}`);
    expect(byId.get('centerToleranceMeters')!.value).toBe(CENTER_TOLERANCE_METERS);
    expect(byId.get('recordsLimits')!.value).toBe(`${RECORDS_LIMITS.maxRecords} records; ${RECORDS_LIMITS.maxBytes / 1024 / 1024} MiB`);
    expect(byId.get('defaultPort')!.value).toBe(DEFAULT_PORT);
    expect(byId.get('maxParts')!.value).toBe(MAX_PARTS);
    expect(byId.get('maxRowCharacters')!.value).toBe(MAX_ROW_CHARACTERS);
    expect(byId.get('meterGrid')!.value).toBe(`${METER_GRID_LIMITS.smallest} to ${METER_GRID_LIMITS.largest}`);
    expect(byId.get('generalisationDistance')!.value).toBe(`${DISTANCE_LIMITS.smallest} to ${DISTANCE_LIMITS.largest}`);
    expect(byId.get('sensitiveTaxaLimit')!.value).toBe(`${SENSITIVE_TAXA_LIMIT / 1024 / 1024} MiB`);
    const s = SERVER_DEFAULTS;
    expect(byId.get('serverDefaults')!.value).toBe(`${s.host}; ${s.resultCache} results; ${s.bodyLimit / 1024} KiB; ${s.uploadLimit / 1024 / 1024} MiB; ${s.rateLimit.max} a minute`);
  });

  it('gives every entry a source and what changes it, under a unique id', () => {
    expect(byId.size).toBe(choices.length);
    for (const c of choices) {
      expect(c.source, c.id).not.toBe('');
      expect(c.changedBy, c.id).not.toBe('');
      if (c.kind === 'method') expect(c.source, c.id).toMatch(/docs\/method\.md §/);
    }
    expect(methodChoiceValues().nearMinimumMeters).toBe(METHOD_DEFAULTS.nearMinimumMeters);
  });

  it('is printed by `whereabouts method`, as a table and as JSON (the real CLI)', async () => {
    const run = promisify(execFile);
    const cli = join(root, 'bin/whereabouts.js');
    const json = await run(process.execPath, [cli, 'method', '--json'], { cwd: root });
    expect(JSON.parse(json.stdout)).toEqual(choices);
    const table = await run(process.execPath, [cli, 'method'], { cwd: root });
    expect(table.stdout).toContain('nearMinimumMeters (method)');
    expect(table.stdout).toContain(`value:      ${METHOD_DEFAULTS.unknownDatumMeters} m`);
  });
});
