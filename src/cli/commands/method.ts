import type { Command } from 'commander';

/**
 * `whereabouts method [--json]`: every [CHOICE] the method leaves open, with its value, source and what changes it.
 * @example whereabouts method --json | jq '.[] | select(.id == "nearMinimumMeters").value'  # 1000
 */
export function registerMethod(program: Command): void {
  program
    .command('method')
    .description('list every choice the published method leaves open: its value here, its source, and the option that changes it')
    .option('--json', 'print the list as JSON')
    .action(async (opts: { json?: boolean }) => {
      const { methodChoices } = await import('../../georef/method-choices.ts');
      const choices = methodChoices();
      if (opts.json) {
        process.stdout.write(`${JSON.stringify(choices, null, 2)}\n`);
        return;
      }
      const lines = choices.map((c) =>
        [`${c.id} (${c.kind})`, `  choice:     ${c.choice}`, `  value:      ${c.value}${c.unit ? ` ${c.unit}` : ''}`, `  source:     ${c.source}`, `  changed by: ${c.changedBy}`].join('\n'),
      );
      process.stdout.write(`${lines.join('\n\n')}\n\nEvery value is whereabouts' own where the sources are silent; see docs/method.md.\n`);
    });
}
