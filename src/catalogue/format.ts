// catalogue stage: write a catalogue as JSON text (deterministic bytes) and read one back, checked
// against its version, catalogues/catalogue.schema.json and itself (consistency.ts). Version 1 files
// (one entry per candidate, one start each, no saddles searched) are upgraded to version 2 in memory.

import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { ValidateFunction } from 'ajv';
import { CatalogueFormatError } from '../errors.ts';
import { checkCatalogueConsistency } from './consistency.ts';
import { CATALOGUE_FORMAT, CATALOGUE_VERSION, CATALOGUE_VERSIONS_READ, type Catalogue, roundedWritten } from './types.ts';

export { WRITE_DIGITS } from './types.ts';

/**
 * The catalogue as JSON text: the head pretty-printed, one entry per line, floats to 12 significant
 * digits except in the query, keys in a fixed order. Same catalogue, same bytes.
 */
export function writeCatalogue(catalogue: Catalogue): string {
  const { entries: all, ...head } = roundedWritten(catalogue) as Catalogue;
  const entries = catalogue.compact === true ? all.filter((e) => e.status === 'ok') : all;
  // the query as asked, to the last digit: areas that differ only beyond 12 digits are still different
  // areas to the ranking (other classes, other candidates), and the reader recounts from them
  head.query = catalogue.query;
  const lines = [
    '{',
    `  "format": ${JSON.stringify(head.format)},`,
    `  "version": ${head.version},`,
    ...(catalogue.compact === true ? ['  "compact": true,'] : []),
    `  "query": ${JSON.stringify(head.query)},`,
    `  "counts": ${JSON.stringify(head.counts)},`,
    '  "entries": [',
    ...(entries.length > 0 ? [entries.map((e) => `    ${JSON.stringify(e)}`).join(',\n')] : []),
    '  ]',
    '}',
  ];
  return lines.join('\n') + '\n';
}

/**
 * A version 1 catalogue as version 2 says the same thing, in place: every candidate was relaxed from one
 * first drawing and saddles were not searched for (query.starts 1, query.unstable false); each
 * certified entry was reached by that start (reached 1, no family recorded); counts.saddles is the
 * certified entries of index above 0. Leaves anything malformed as it is, for the schema to name.
 */
function upgradeVersion1(data: Record<string, unknown>): void {
  data.version = CATALOGUE_VERSION;
  const query = data.query as Record<string, unknown> | null;
  if (query !== null && typeof query === 'object' && !Array.isArray(query)) Object.assign(query, { starts: 1, unstable: false });
  const counts = data.counts as Record<string, unknown> | null;
  if (counts !== null && typeof counts === 'object' && typeof counts.equilibria === 'number' && typeof counts.stable === 'number') {
    // saddles after stable, as version 2 writes them
    const { failures, rootings, ...rest } = counts;
    for (const key of Object.keys(counts)) delete counts[key];
    Object.assign(counts, rest, { saddles: (rest.equilibria as number) - (rest.stable as number), failures, rootings });
  }
  if (!Array.isArray(data.entries)) return;
  for (const entry of data.entries as unknown[]) {
    if (entry === null || typeof entry !== 'object' || Array.isArray(entry)) continue;
    const e = entry as Record<string, unknown>;
    Object.assign(e, { reached: e.status === 'ok' ? 1 : null, tried: 1, family: null });
  }
}

/** The catalogue schema's file; catalogues/ sits two folders above both src/catalogue and dist/catalogue. */
export const CATALOGUE_SCHEMA_URL = new URL('../../catalogues/catalogue.schema.json', import.meta.url);

let validator: ValidateFunction | null = null;

/** The compiled schema check, built on first use (ajv is loaded only by verbs that read catalogues). */
function catalogueValidator(): ValidateFunction {
  if (validator === null) {
    const { Ajv } = createRequire(import.meta.url)('ajv') as typeof import('ajv');
    const schema = JSON.parse(readFileSync(CATALOGUE_SCHEMA_URL, 'utf8')) as object;
    validator = new Ajv({ allErrors: false, strict: false }).compile(schema);
  }
  return validator;
}

/** What a JSON value other than null is, in words: "a string", "an array", ... */
function kindOf(value: unknown): string {
  if (Array.isArray(value)) return 'an array';
  return typeof value === 'object' ? 'an object' : `a ${typeof value}`;
}

/**
 * Read a catalogue from JSON text (a leading UTF-8 byte-order mark is skipped), then check it: format
 * name, version (1 or 2; a version 1 file is returned as version 2 says it), schema, and the consistency
 * of its counts, ranks and answers (consistency.ts).
 * @throws CatalogueFormatError when the text is not JSON, not a lather catalogue, of another version,
 *   fails the schema or contradicts itself; the message names `source` and, for an entry, which one.
 */
export function readCatalogue(text: string, source = 'catalogue'): Catalogue {
  let data: unknown;
  try {
    // Does the text start with a byte-order mark (some editors write one)? It is not part of the JSON.
    data = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch {
    throw new CatalogueFormatError(`${source} is not JSON when expected a ${CATALOGUE_FORMAT} file.`);
  }
  const head = data as { format?: unknown; version?: unknown } | null;
  if (head === null || typeof head !== 'object' || head.format !== CATALOGUE_FORMAT) {
    throw new CatalogueFormatError(`${source} has format ${JSON.stringify(head?.format ?? null)} when expected "${CATALOGUE_FORMAT}".`);
  }
  if (typeof head.version !== 'number') {
    const given = head.version === undefined || head.version === null
      ? `is ${head.version === null ? 'null' : 'missing'}`
      : `${JSON.stringify(head.version)} is ${kindOf(head.version)}`;
    throw new CatalogueFormatError(`${source}: version ${given} when expected the number ${CATALOGUE_VERSION}.`);
  }
  if (!CATALOGUE_VERSIONS_READ.includes(head.version)) {
    throw new CatalogueFormatError(`Got v${head.version} catalogue in ${source} when expected v${CATALOGUE_VERSIONS_READ.join(' or v')}.`);
  }
  if (head.version === 1) upgradeVersion1(head as Record<string, unknown>);
  const validate = catalogueValidator();
  if (!validate(data)) {
    const err = validate.errors?.[0];
    const where = err?.instancePath || '/';
    throw new CatalogueFormatError(`${source} fails its schema at ${where}: ${err?.message ?? 'invalid'} when expected a valid v${CATALOGUE_VERSION} catalogue.`);
  }
  const catalogue = data as unknown as Catalogue;
  checkCatalogueConsistency(catalogue, source);
  return catalogue;
}
