// cli stage: the viewer page's script, the browser bundle of src/view/client/main.ts (the page's own
// code with the library's maps, geometry, solver and drawing). The package ships it built
// (dist/view/client.js, made by `npm run build`); run from the sources, it is bundled on demand with
// esbuild, which only development installs have.

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** Where the built bundle sits beside the compiled CLI (dist/cli -> dist/view). */
const BUILT_SCRIPT = new URL('../view/client.js', import.meta.url);
/** The bundle's entry in the sources (src/cli -> src/view/client, or dist/cli -> src/view/client at build time). */
export const CLIENT_ENTRY = new URL(import.meta.url.endsWith('.ts') ? '../view/client/main.ts' : '../../src/view/client/main.ts', import.meta.url);

/**
 * Bundle the page script for the browser: one ES module, minified, with nothing left to load. A module
 * that needs Node (node:fs, node:module, ...) cannot reach it: esbuild, bundling for the browser, fails
 * on such an import. Same sources, same bytes.
 */
export async function bundlePageScript(entry: URL = CLIENT_ENTRY): Promise<string> {
  const esbuild = await import('esbuild');
  const result = await esbuild.build({
    entryPoints: [fileURLToPath(entry)],
    bundle: true,
    format: 'esm',
    platform: 'browser',
    target: 'es2022',
    minify: true,
    legalComments: 'none',
    charset: 'utf8',
    write: false,
    logLevel: 'silent',
  });
  return result.outputFiles[0].text;
}

let bundled: Promise<string> | null = null;

/**
 * The page script: the built bundle when this is the compiled package, a fresh bundle of the sources
 * when it runs from them. @throws Error (a failed run) when the compiled package lacks its bundle.
 */
export async function pageScript(): Promise<string> {
  if (import.meta.url.endsWith('.ts')) {
    bundled ??= bundlePageScript();
    return bundled;
  }
  try {
    return readFileSync(BUILT_SCRIPT, 'utf8');
  } catch {
    throw new Error(`The page script ${fileURLToPath(BUILT_SCRIPT)} is missing when expected with the built package (npm run build makes it).`);
  }
}
