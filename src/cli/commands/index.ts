/** Every CLI command, in the order `exact-dw help` lists them. */
import type { Command } from './command.js';
import { testCommand } from './test.js';
import { batchCommand } from './batch.js';
import { pvalueCommand } from './pvalue.js';
import { criticalCommand } from './critical.js';
import { powerCommand } from './power.js';
import { diagnoseCommand } from './diagnose.js';
import { boundsCommand } from './bounds.js';
import { tableCommand } from './table.js';
import { demoCommand } from './demo.js';

export const COMMANDS: Command[] = [
  testCommand,
  batchCommand,
  pvalueCommand,
  criticalCommand,
  powerCommand,
  diagnoseCommand,
  boundsCommand,
  tableCommand,
  demoCommand,
];
