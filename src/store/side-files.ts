/**
 * The files whereabouts keeps beside a gazetteer file, named from its path in one place: the batch
 * job database, the review database and the folder of batch inputs and outputs. `/data/g.sqlite`
 * has `/data/g.jobs.sqlite`, `/data/g.reviews.sqlite` and `/data/g.batches/` (a file layout users
 * see, so part of the public contract).
 */
import { basename, dirname, join } from 'node:path';

/** `<gazetteer without .sqlite><suffix>` in the gazetteer's folder. */
function besideGazetteer(gazetteerPath: string, suffix: string): string {
  return join(dirname(gazetteerPath), `${basename(gazetteerPath).replace(/\.sqlite$/, '')}${suffix}`);
}

/**
 * The job database that goes with a gazetteer file.
 * @example jobsDatabasePath('/data/whereabouts.sqlite') // '/data/whereabouts.jobs.sqlite'
 */
export function jobsDatabasePath(gazetteerPath: string): string {
  return besideGazetteer(gazetteerPath, '.jobs.sqlite');
}

/**
 * The review file that goes with a gazetteer file.
 * @example reviewsDatabasePath('/data/whereabouts.sqlite') // '/data/whereabouts.reviews.sqlite'
 */
export function reviewsDatabasePath(gazetteerPath: string): string {
  return besideGazetteer(gazetteerPath, '.reviews.sqlite');
}

/**
 * The folder of the HTTP service's batch uploads and outputs for a gazetteer file.
 * @example batchFolderPath('/data/whereabouts.sqlite') // '/data/whereabouts.batches'
 */
export function batchFolderPath(gazetteerPath: string): string {
  return besideGazetteer(gazetteerPath, '.batches');
}

/**
 * A temporary file an import sorts one index's pairs in (src/store/import-writers.ts), beside the
 * gazetteer, where there is room for what the gazetteer will hold. It is removed from the folder as soon
 * as it is opened, so no import, even one killed, leaves it behind.
 * @example importSortPath('/data/whereabouts.sqlite', 'postings') // '/data/whereabouts.postings.import-sort'
 */
export function importSortPath(gazetteerPath: string, index: string): string {
  return besideGazetteer(gazetteerPath, `.${index}.import-sort`);
}
