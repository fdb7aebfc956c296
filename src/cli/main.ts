#!/usr/bin/env node
/** The `exact-dw` executable. */
import { runCli } from './run.js';

// a reader that stops early (`exact-dw batch ... | head`) closes the pipe: stop quietly
process.stdout.on('error', (err: NodeJS.ErrnoException) => {
  if (err.code === 'EPIPE') process.exit(0);
  throw err;
});

runCli(process.argv.slice(2)).then((status) => { process.exitCode = status; });
