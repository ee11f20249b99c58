// Entry of a worker thread (the batch's, and the service's) when run from the TypeScript sources (dist/ uses the compiled task modules). Worker threads do not inherit the tsx loader of the main thread,
// so it is registered here before the TypeScript task modules are loaded (as bin/whereabouts.js does).
import { register } from 'tsx/esm/api';

register();
const task = await import('./georeference-task.ts');
const recordTask = await import('./record-task.ts');

export default task.default;
export const answerRecord = recordTask.answerRecord;
