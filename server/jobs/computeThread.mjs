// Entry of a compute worker thread: the thread starts with no loader flags (execArgv: []), so it
// registers the TypeScript loader itself, once, and then runs the TypeScript body.
import { register } from 'tsx/esm/api';

register();
await import('./computeThread.ts');
