/**
 * The `whereabouts` command line. `--db <file>` may stand before or after the verb, so it is taken out
 * of the arguments before commander sees them; every verb then opens the same database.
 */
import { Command, CommanderError } from 'commander';
import { VERSION } from '../version.ts';
import { registerBatch } from './commands/batch.ts';
import { registerClusterScript } from './commands/cluster-script.ts';
import { registerMerge } from './commands/merge.ts';
import { registerMethod } from './commands/method.ts';
import { registerDoctor } from './commands/doctor.ts';
import { registerGazetteer } from './commands/gazetteer.ts';
import { registerImport } from './commands/import.ts';
import { registerLocate } from './commands/locate.ts';
import { registerServe } from './commands/serve.ts';
import { takeDbOption } from './db-option.ts';

const { dbPath, rest } = takeDbOption(process.argv.slice(2), process.env);

const program = new Command('whereabouts')
  .version(VERSION)
  .description('Georeference specimen-label locality text against your own gazetteer (point-radius method).')
  .option('--db <file>', 'the SQLite database (env WHEREABOUTS_DB; default ./whereabouts.sqlite)')
  .exitOverride()
  .showHelpAfterError();

const db = () => dbPath;
registerImport(program, db);
registerGazetteer(program, db);
registerLocate(program, db);
registerBatch(program, db);
registerMerge(program, db);
registerClusterScript(program, db);
registerServe(program, db);
registerDoctor(program, db);
registerMethod(program);

try {
  await program.parseAsync(rest, { from: 'user' });
} catch (error) {
  if (error instanceof CommanderError) process.exit(error.exitCode);
  process.stderr.write(`whereabouts: ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
}
