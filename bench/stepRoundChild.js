// Entry of one round of the step benchmark in a process of its own (bench/stepRound.ts): the
// TypeScript loader first, then the round.
import { register } from 'tsx/esm/api';

register();
await import('./stepRoundMain.ts');
