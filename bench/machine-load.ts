/**
 * The machine's load as the benchmarks print it beside their figures: other work on a shared machine
 * slows every figure, so a figure is read together with the load it was taken under.
 * @example console.log(`load at start: ${machineLoad()}`) // "load at start: 1.19 1.80 2.58 on 2 cores"
 */
import { cpus, loadavg } from 'node:os';

/** The 1, 5 and 15 minute load averages and the number of cores, as one line. */
export function machineLoad(): string {
  return `${loadavg().map((l) => l.toFixed(2)).join(' ')} on ${cpus().length} cores`;
}
