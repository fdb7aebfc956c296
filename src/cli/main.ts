#!/usr/bin/env node
/** The `exact-dw` executable. */
import { runCli } from './run.js';

runCli(process.argv.slice(2)).then((status) => { process.exitCode = status; });
