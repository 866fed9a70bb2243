#!/usr/bin/env node
// lather command-line entry: runs the TypeScript sources through tsx.
import { register } from 'tsx/esm/api';
register();
await import('../src/cli/main.ts');
