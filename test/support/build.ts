/**
 * Vitest global setup: compiles src/ to dist/ once before the tests (`npm run build`), so the CLI and
 * server the tests spawn through bin/whereabouts.js run the sources as they are now, not an older build.
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export default function build(): void {
  execFileSync('npm', ['run', '--silent', 'build'], { cwd: fileURLToPath(new URL('../../', import.meta.url)), stdio: 'inherit' });
}
