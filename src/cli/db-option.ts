/** The default database file, beside where the command is run. */
export const DEFAULT_DB = './whereabouts.sqlite';

/**
 * Takes `--db <file>` or `--db=<file>` out of the arguments wherever it stands (before or after the
 * verb) and resolves the database path: the option, then env WHEREABOUTS_DB, then ./whereabouts.sqlite.
 * @example takeDbOption(['locate', 'X', '--db', 'g.sqlite'], {}) // { dbPath: 'g.sqlite', rest: ['locate', 'X'] }
 */
export function takeDbOption(args: readonly string[], env: NodeJS.ProcessEnv): { dbPath: string; rest: string[] } {
  const rest: string[] = [];
  let dbPath: string | undefined;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (arg === '--') {
      rest.push(...args.slice(i));
      break;
    }
    if (arg === '--db') {
      if (i + 1 >= args.length) throw new Error('--db needs a file name');
      dbPath = args[++i];
    } else if (arg.startsWith('--db=')) {
      dbPath = arg.slice('--db='.length);
    } else {
      rest.push(arg);
    }
  }
  return { dbPath: dbPath ?? env.WHEREABOUTS_DB ?? DEFAULT_DB, rest };
}
