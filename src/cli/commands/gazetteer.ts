import type { Command } from 'commander';

/**
 * `whereabouts gazetteer list` and `whereabouts gazetteer remove <source>`: the sources in the store,
 * each with what a georeference needs to cite it and reproduce it (citation, licence, date, hash).
 */
export function registerGazetteer(program: Command, dbPath: () => string): void {
  const gazetteer = program.command('gazetteer').description('list or remove the gazetteer sources in the store');
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
              + `  citation: ${source.citation}\n  licence: ${source.licence ?? 'not recorded'}\n`);
          }
        }
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
