// Entry of a step helper thread: the TypeScript loader first (a worker does not inherit the main
// thread's module hooks), then the helper itself.
import { register } from 'tsx/esm/api';

register();
await import('./stepThreadMain.ts');
