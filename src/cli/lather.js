#!/usr/bin/env node
// cli stage: the `lather` binary; registers tsx so the TypeScript sources run as they are.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('./main.ts');
await main(process.argv);
