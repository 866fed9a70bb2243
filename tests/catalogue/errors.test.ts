// Catalogue files that are not JSON, not ours, of another version or off the schema are refused by class.
import { describe, expect, it } from 'vitest';
import { readCatalogue, writeCatalogue } from '../../src/catalogue/format.ts';
import { rankAreas } from '../../src/catalogue/rank.ts';
import { CatalogueFormatError } from '../../src/errors.ts';

describe('readCatalogue', () => {
  it('readCatalogue refuses text that is not JSON, another format, another version, or off the schema', async () => {
    const good = writeCatalogue(await rankAreas([1, 1]));
    const data = JSON.parse(good);
    expect(() => readCatalogue('{"format": "lather-catalogue", "vers')).toThrow(CatalogueFormatError);
    expect(() => readCatalogue(JSON.stringify({ ...data, format: 'something-else' }))).toThrow(CatalogueFormatError);
    // version 2 since the catalogue lists every equilibrium found (issue 11); version 1 is still read
    expect(() => readCatalogue(JSON.stringify({ ...data, version: 3 }))).toThrow(/Got v3 catalogue in catalogue when expected v1 or v2/);
    expect(() => readCatalogue(JSON.stringify({ ...data, entries: [{ ...data.entries[0], perimeter: 'long' }] }))).toThrow(CatalogueFormatError);
    expect(() => readCatalogue(JSON.stringify({ ...data, counts: { ...data.counts, tried: -1 } }))).toThrow(CatalogueFormatError);
    expect(() => readCatalogue(good)).not.toThrow();
  });
});
