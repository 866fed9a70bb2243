#!/usr/bin/env node
// cli stage: the `lather` binary. The exit status is set, never forced: the process ends when standard
// output has drained. Every verb loads on demand (see main.ts).
import { main } from './main.ts';

process.exitCode = await main(process.argv);
