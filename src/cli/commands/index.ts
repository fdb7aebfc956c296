/** Every CLI command, in the order `exact-dw help` lists them. */
import type { Command } from './command.js';
import { testCommand } from './test.js';
import { pvalueCommand } from './pvalue.js';
import { criticalCommand } from './critical.js';
import { demoCommand } from './demo.js';

export const COMMANDS: Command[] = [
  testCommand,
  pvalueCommand,
  criticalCommand,
  demoCommand,
];
