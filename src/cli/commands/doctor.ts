import type { Command } from 'commander';
import type { DoctorReport } from '../../store/doctor.ts';

const LABELS = { ok: 'ok     ', note: 'note   ', problem: 'PROBLEM' } as const;

/**
 * `whereabouts doctor`: examines the store without writing to it and prints each check with what to
 * do about anything found; exits 1 when a check finds a problem (notes alone exit 0).
 */
export function registerDoctor(program: Command, dbPath: () => string): void {
  program
    .command('doctor')
    .description("check the store's integrity, schema version, journal mode, index rows and batch jobs, and say what to do")
    .option('--json', 'print the report as JSON')
    .option('--quick', 'a faster integrity check (PRAGMA quick_check) that skips comparing each index with its table')
    .action(async (opts: { json?: boolean; quick?: boolean }) => {
      const { examineStore } = await import('../../store/doctor.ts');
      const report = examineStore(dbPath(), { quick: opts.quick });
      process.stdout.write(opts.json ? `${JSON.stringify(report, null, 2)}\n` : describe(report));
      if (!report.healthy) process.exitCode = 1;
    });
}

function describe(report: DoctorReport): string {
  const lines = [`store ${report.storePath}`];
  for (const c of report.checks) {
    lines.push(`${LABELS[c.status]} ${c.check}: ${c.finding}`);
    if (c.remedy !== undefined && c.status !== 'ok') lines.push(`        what to do: ${c.remedy}`);
  }
  const problems = report.checks.filter((c) => c.status === 'problem').length;
  lines.push(problems === 0 ? 'no problem found' : `${problems} problem${problems === 1 ? '' : 's'} found`);
  return `${lines.join('\n')}\n`;
}
