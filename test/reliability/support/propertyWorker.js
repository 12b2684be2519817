// Entry of a property-test worker thread: the TypeScript loader first (a worker does not inherit
// the test runner's transforms), then the runner of one boundary's property.
import { register } from 'tsx/esm/api';

register();
await import('./propertyWorkerMain.ts');
