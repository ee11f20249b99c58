/**
 * Makes sure the Debian packages the tests drive are on this machine before `npm test` runs (the
 * `pretest` script). A missing package is installed with apt-get when this runs as root; otherwise the
 * one command to run is printed and the test run stops, so a fresh machine never fails later with a
 * puzzling "browser not found".
 */
import { spawnSync } from 'node:child_process';
import { accessSync, constants } from 'node:fs';
import { pathToFileURL } from 'node:url';

/** A Debian package the tests need, and the files (programs, library descriptions) whose presence shows it is installed. */
export interface SystemPackage {
  name: string;
  provides: readonly string[];
  neededBy: string;
}

/** The one list of system packages the tests need: add a package here when a test drives it. */
export const SYSTEM_PACKAGES: readonly SystemPackage[] = [
  { name: 'chromium', provides: ['/usr/bin/chromium'], neededBy: 'the page tests (test/web, through playwright-core)' },
  { name: 'slurm-wlm', provides: ['/usr/sbin/slurmctld', '/usr/sbin/slurmd'], neededBy: 'the single-node cluster of the split-batch test (test/cluster)' },
  { name: 'munge', provides: ['/usr/sbin/munged'], neededBy: "Slurm's authentication in the split-batch test (test/cluster)" },
  { name: 'gdal-bin', provides: ['/usr/bin/ogrinfo', '/usr/bin/ogr2ogr', '/usr/bin/gdaltransform'], neededBy: 'reading the GeoPackage and GeoJSON batch writes, building the GIS files the import tests read (test/output, test/store/gis-import, test/geodesy/crs)' },
  { name: 'r-base-core', provides: ['/usr/bin/Rscript'], neededBy: "the README's R recipe run against the real server (test/examples)" },
  { name: 'r-cran-httr', provides: ['/usr/lib/R/site-library/httr/DESCRIPTION'], neededBy: "the README's R recipe (test/examples)" },
  { name: 'r-cran-jsonlite', provides: ['/usr/lib/R/site-library/jsonlite/DESCRIPTION'], neededBy: "the README's R recipe (test/examples)" },
];

export type SystemPackagePlan =
  | { action: 'none' }
  | { action: 'install'; packages: string[] }
  | { action: 'fail'; packages: string[]; message: string };

/**
 * What to do about the missing packages: nothing, install them (root with apt-get), or stop with the
 * command a person must run.
 * @example planSystemPackages([], { isRoot: false, hasAptGet: true }) // { action: 'none' }
 */
export function planSystemPackages(missing: readonly SystemPackage[], host: { isRoot: boolean; hasAptGet: boolean }): SystemPackagePlan {
  if (missing.length === 0) return { action: 'none' };
  const packages = missing.map((p) => p.name);
  if (host.isRoot && host.hasAptGet) return { action: 'install', packages };
  const why = missing.map((p) => `${p.name} (${p.provides.join(', ')}, for ${p.neededBy})`).join('; ');
  const command = host.hasAptGet ? `sudo apt-get install -y ${packages.join(' ')}` : `install the Debian packages ${packages.join(' ')} with this system's package manager`;
  return { action: 'fail', packages, message: `npm test needs system packages that are missing: ${why}. Run: ${command}, then npm test again.` };
}

function isInstalled(p: SystemPackage): boolean {
  try {
    for (const file of p.provides) accessSync(file, constants.F_OK);
    return true;
  } catch {
    return false;
  }
}

function hasAptGet(): boolean {
  return spawnSync('apt-get', ['--version'], { stdio: 'ignore' }).status === 0;
}

/** Checks, installs when it may, and returns the exit status for the pretest script. */
export function ensureSystemPackages(packages: readonly SystemPackage[] = SYSTEM_PACKAGES): number {
  const plan = planSystemPackages(packages.filter((p) => !isInstalled(p)), { isRoot: process.getuid?.() === 0, hasAptGet: hasAptGet() });
  if (plan.action === 'none') return 0;
  if (plan.action === 'fail') {
    process.stderr.write(`${plan.message}\n`);
    return 1;
  }
  process.stderr.write(`whereabouts tests: installing ${plan.packages.join(' ')} with apt-get (needed by the tests)\n`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [['update', '-q'], ['install', '-y', '-q', ...plan.packages]]) {
    const run = spawnSync('apt-get', args, { stdio: ['ignore', 'inherit', 'inherit'], env });
    if (run.status !== 0) {
      process.stderr.write(`apt-get ${args.join(' ')} failed (status ${run.status}): install ${plan.packages.join(' ')} by hand, then npm test again.\n`);
      return 1;
    }
  }
  const still = packages.filter((p) => !isInstalled(p));
  if (still.length) {
    process.stderr.write(`apt-get finished but ${still.map((p) => p.provides.join(', ')).join(', ')} is still missing.\n`);
    return 1;
  }
  return 0;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) process.exitCode = ensureSystemPackages();
