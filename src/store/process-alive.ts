/**
 * Whether the process `pid` still runs: signal 0 tests without sending anything, and EPERM means it
 * runs as another user. A process killed with -9 leaves its pid behind in what it wrote, which is then
 * not alive (a pid may be reused later; the checks that ask accept that).
 * @example processIsAlive(process.pid) // true
 */
export function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}
