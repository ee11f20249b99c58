import type { Command } from 'commander';

/**
 * `whereabouts gazetteer list`, `remove <source>` and `priority <source> <rank>`: the sources in the
 * store, each with what a georeference needs to cite it and reproduce it (citation, licence, date,
 * hash), and which is cited first where several hold the same place.
 */
export function registerGazetteer(program: Command, dbPath: () => string): void {
  const gazetteer = program.command('gazetteer').description('list, rank or remove the gazetteer sources in the store');
  gazetteer
    .command('list')
    .description('list the gazetteer sources')
    .option('--json', 'print the sources as JSON')
    .action(async (opts: { json?: boolean }) => {
      const { openGazetteer } = await import('../../store/gazetteer-store.ts');
      const store = openGazetteer(dbPath(), { readonly: true });
      try {
        const sources = store.sources();
        if (opts.json) {
          process.stdout.write(`${JSON.stringify(sources, null, 2)}\n`);
        } else if (sources.length === 0) {
          process.stdout.write('no gazetteer sources: load one with `whereabouts import <file>`\n');
        } else {
          for (const source of sources) {
            process.stdout.write(`${source.id}\t${source.featureCount} features\timported ${source.importedAt}\tsha256 ${source.contentHash}\n`
              + `  citation: ${source.citation}\n  licence: ${source.licence ?? 'not recorded'}\n`
              + `  priority: ${source.priority ?? 'not set (after the ranked sources, in the order imported)'}\n`);
          }
        }
      } finally {
        store.close();
      }
    });
  gazetteer
    .command('priority')
    .description('rank a source where several hold the same place: 1 is cited first, the others listed beside it')
    .argument('<source>', 'the source id (see gazetteer list)')
    .argument('<rank>', "a whole number from 1, or 'none' to clear it", parsePriority)
    .action(async (source: string, rank: number | null) => {
      const { openGazetteer } = await import('../../store/gazetteer-store.ts');
      const store = openGazetteer(dbPath());
      try {
        if (!store.setPriority(source, rank)) throw new Error(`no gazetteer source '${source}' (see \`whereabouts gazetteer list\`)`);
        process.stdout.write(rank === null ? `source ${source}: priority cleared\n` : `source ${source}: priority ${rank}\n`);
      } finally {
        store.close();
      }
    });
  gazetteer
    .command('remove')
    .description('remove a gazetteer source and all its features')
    .argument('<source>', 'the source id (see gazetteer list)')
    .action(async (source: string) => {
      const { openGazetteer } = await import('../../store/gazetteer-store.ts');
      const store = openGazetteer(dbPath());
      try {
        if (!store.removeSource(source)) throw new Error(`no gazetteer source '${source}' (see \`whereabouts gazetteer list\`)`);
        process.stdout.write(`removed source ${source}\n`);
      } finally {
        store.close();
      }
    });
}

/**
 * A source priority as typed: a whole number from 1, or 'none'.
 * @example parsePriority('2') // 2
 * @example parsePriority('none') // null
 */
export function parsePriority(value: string): number | null {
  if (value.trim().toLowerCase() === 'none') return null;
  if (!/^\s*\d+\s*$/.test(value) || Number(value) < 1) throw new Error(`a source priority is a whole number from 1 (cited first) or 'none', not '${value}'`);
  return Number(value);
}
