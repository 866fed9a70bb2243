#!/usr/bin/env node
// cli stage: the `lather` binary; registers tsx so the TypeScript sources run as they are.
import { register } from 'tsx/esm/api';

register();
await import('./main.ts');
