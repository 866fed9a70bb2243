// Build step (npm run build, after tsc): bundle the catalogue viewer's page script into
// dist/view/client.js, which `lather view` reads at run time.
import { mkdirSync, writeFileSync } from 'node:fs';
import { bundlePageScript } from '../dist/cli/page-script.js';

const out = new URL('../dist/view/client.js', import.meta.url);
mkdirSync(new URL('.', out), { recursive: true });
writeFileSync(out, await bundlePageScript());
