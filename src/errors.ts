// shared: error classes by kind; every message names the bad value and what was expected.

/** A map or arrangement code that is malformed or not an admissible cluster. */
export class MapError extends Error {
  override name = 'MapError';
}

/** A command-line or API argument that is out of range or unreadable. */
export class UsageError extends Error {
  override name = 'UsageError';
}

/** A catalogue file that fails its schema, its format name or its version. */
export class CatalogueFormatError extends Error {
  override name = 'CatalogueFormatError';
}

/** An area formula that does not parse, names an unknown symbol or is not positive on its range. */
export class FormulaError extends Error {
  override name = 'FormulaError';
}
