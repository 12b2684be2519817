// Entry of a sweep worker thread: the TypeScript loader first (a worker does not inherit the
// main thread's module hooks), then the worker itself.
import { register } from 'tsx/esm/api';

register();
await import('./sweepWorkerMain.ts');
