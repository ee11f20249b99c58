/**
 * The pretest check of system packages: its decision for each case (present, missing as root with
 * apt-get, missing otherwise), and one real run on this machine.
 */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { planSystemPackages, SYSTEM_PACKAGES, type SystemPackage } from '../../scripts/system-packages.ts';

const chromium: SystemPackage = { name: 'chromium', provides: ['/usr/bin/chromium'], neededBy: 'the page tests' };
const gdal: SystemPackage = { name: 'gdal-bin', provides: ['/usr/bin/gdalinfo'], neededBy: 'the GeoPackage tests' };

describe('planSystemPackages', () => {
  it('does nothing when every package is present', () => {
    expect(planSystemPackages([], { isRoot: true, hasAptGet: true })).toEqual({ action: 'none' });
    expect(planSystemPackages([], { isRoot: false, hasAptGet: false })).toEqual({ action: 'none' });
  });

  it('installs what is missing when it runs as root with apt-get', () => {
    expect(planSystemPackages([chromium, gdal], { isRoot: true, hasAptGet: true })).toEqual({ action: 'install', packages: ['chromium', 'gdal-bin'] });
  });

  it('stops with the one command to run when it is not root', () => {
    const plan = planSystemPackages([chromium], { isRoot: false, hasAptGet: true });
    expect(plan).toMatchObject({ action: 'fail', packages: ['chromium'] });
    expect(plan.action === 'fail' && plan.message).toContain('Run: sudo apt-get install -y chromium, then npm test again.');
    expect(plan.action === 'fail' && plan.message).toContain('/usr/bin/chromium');
  });

  it('names the Debian packages when there is no apt-get', () => {
    const plan = planSystemPackages([chromium, gdal], { isRoot: true, hasAptGet: false });
    expect(plan.action === 'fail' && plan.message).toContain('install the Debian packages chromium gdal-bin');
  });
});

describe('the pretest script on this machine', () => {
  it('lists chromium for the page tests, and Slurm with munge for the cluster test', () => {
    expect(SYSTEM_PACKAGES.map((p) => p.name)).toEqual(expect.arrayContaining(['chromium', 'slurm-wlm', 'munge']));
  });

  it('runs as npm runs it and finds (or installs) what the tests need', () => {
    const run = spawnSync('npm', ['run', '--silent', 'pretest'], { cwd: new URL('../..', import.meta.url).pathname, encoding: 'utf8' });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
  }, 600_000);
});
