// Entry of a batch worker thread when run from the TypeScript sources (dist/ uses the compiled task module). Worker threads do not inherit the tsx loader of the main thread,
// so it is registered here before the TypeScript task module is loaded (as bin/whereabouts.js does).
import { register } from 'tsx/esm/api';

register();
const task = await import('./georeference-task.ts');

export default task.default;
