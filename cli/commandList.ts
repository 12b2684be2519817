import { analyzeCmd } from './analyzeCommand';
import type { Command } from './command';
import { mergeCommand } from './commands/merge';
import { planCommand } from './commands/plan';
import { runCommand } from './commands/run';
import { sweepCommand } from './commands/sweep';

/** Every `stria` command, in the order `stria --help` lists them. A new command is one more entry. */
export const COMMANDS: readonly Command[] = [runCommand, sweepCommand, mergeCommand, planCommand, analyzeCmd];
