// atlas stage: an atlas as a "lather-atlas" JSON document (deterministic bytes), and its reader, checked
// against catalogues/atlas.schema.json and its version.

import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { ValidateFunction } from 'ajv';
import { CatalogueFormatError } from '../errors.ts';
import { roundedWritten } from '../catalogue/types.ts';
import type { Atlas } from './types.ts';

/** Format name written into every atlas file. */
export const ATLAS_FORMAT = 'lather-atlas';
/** Version of the atlas format this release reads and writes. */
export const ATLAS_VERSION = 1;

/**
 * The atlas as JSON text: the query on one line, the summary one field (or one class, one boundary) per
 * line, one sample per line, floats to 12
 * significant digits, keys in a fixed order. Same atlas, same bytes. An unbounded reachable ratio
 * (least share 0) is written as null.
 */
export function atlasJson(atlas: Atlas): string {
  // floats to 12 significant digits, as catalogues are written (the relaxer certifies to about 1e-10)
  const a = roundedWritten(atlas) as Atlas;
  const query = {
    cells: a.cells, samples: a.samples.length, seed: a.seed, minShare: a.minShare,
    ...(a.types === undefined ? {} : { types: a.types, tensions: a.tensions ?? {} }),
  };
  const summary = {
    reachableRatio: Number.isFinite(a.reachableRatio) ? a.reachableRatio : null,
    largestRatio: a.largestRatio,
    exhaustive: a.exhaustive,
    candidates: a.candidates,
    warmShare: a.warmShare,
    noWinner: a.noWinner,
    smallestMargin: a.smallestMargin,
    smallestMarginAt: a.smallestMarginAt,
    smallestArrangementMargin: a.smallestArrangementMargin,
    smallestArrangementMarginAt: a.smallestArrangementMarginAt,
    classes: a.classes,
    changes: a.changes,
    boundaries: a.boundaries,
    claim: a.claim,
  };
  const lines = [
    '{',
    `  "format": ${JSON.stringify(ATLAS_FORMAT)},`,
    `  "version": ${ATLAS_VERSION},`,
    `  "query": ${JSON.stringify(query)},`,
    '  "summary": {',
    Object.entries(summary)
      .map(([k, v]) => Array.isArray(v) && v.length > 0 && typeof v[0] === 'object' && !Array.isArray(v[0])
        ? `    ${JSON.stringify(k)}: [\n${v.map((x) => `      ${JSON.stringify(x)}`).join(',\n')}\n    ]`
        : `    ${JSON.stringify(k)}: ${JSON.stringify(v)}`)
      .join(',\n'),
    '  },',
    '  "samples": [',
    a.samples.map((s) => `    ${JSON.stringify(s)}`).join(',\n'),
    '  ]',
    '}',
  ];
  return `${lines.join('\n')}\n`;
}

/** The atlas schema's file; catalogues/ sits two folders above both src/atlas and dist/atlas. */
export const ATLAS_SCHEMA_URL = new URL('../../catalogues/atlas.schema.json', import.meta.url);

let validator: ValidateFunction | null = null;

function atlasValidator(): ValidateFunction {
  if (validator === null) {
    const { Ajv } = createRequire(import.meta.url)('ajv') as typeof import('ajv');
    const schema = JSON.parse(readFileSync(ATLAS_SCHEMA_URL, 'utf8')) as object;
    validator = new Ajv({ allErrors: false, strict: false }).compile(schema);
  }
  return validator;
}

/**
 * Read an atlas file's JSON text and check it (format, version, schema); returns the parsed document.
 * @throws CatalogueFormatError when the text is not JSON, not an atlas, of another version, or fails the schema.
 */
export function readAtlas(text: string, source = 'atlas'): Record<string, unknown> {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new CatalogueFormatError(`${source} is not JSON when expected a ${ATLAS_FORMAT} file.`);
  }
  const head = data as { format?: unknown; version?: unknown } | null;
  if (head === null || typeof head !== 'object' || head.format !== ATLAS_FORMAT) {
    throw new CatalogueFormatError(`${source} has format ${JSON.stringify(head?.format ?? null)} when expected "${ATLAS_FORMAT}".`);
  }
  if (head.version !== ATLAS_VERSION) {
    throw new CatalogueFormatError(`Got v${String(head.version)} atlas when expected v${ATLAS_VERSION}.`);
  }
  const validate = atlasValidator();
  if (!validate(data)) {
    const err = validate.errors?.[0];
    throw new CatalogueFormatError(`${source} fails its schema at ${err?.instancePath || '/'}: ${err?.message ?? 'invalid'} when expected a valid v${ATLAS_VERSION} atlas.`);
  }
  return data as Record<string, unknown>;
}
