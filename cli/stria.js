#!/usr/bin/env node
// The `stria` command: registers tsx's ESM loader so Node runs the TypeScript sources directly,
// then hands the arguments to cli/main.ts. The exit code is main's.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('./main.ts');
process.exitCode = await main(process.argv.slice(2));
