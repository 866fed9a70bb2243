// shared: the errors lather raises on purpose, one family. Every message names the bad value and what
// was expected; the CLI prints it as one line with exit status 2. Anything else thrown is a bug.

/** The base of every error lather raises on purpose (bad input through the library or the CLI). */
export class LatherError extends Error {
  override name = 'LatherError';
}

/** A map or arrangement code that is malformed or not an admissible cluster. */
export class MapError extends LatherError {
  override name = 'MapError';
}

/** A command-line or API argument that is out of range or unreadable. */
export class UsageError extends LatherError {
  override name = 'UsageError';
}

/** A catalogue file that fails its schema, its format name or its version. */
export class CatalogueFormatError extends LatherError {
  override name = 'CatalogueFormatError';
}

/** An area formula that does not parse, names an unknown symbol or is not positive on its range. */
export class FormulaError extends LatherError {
  override name = 'FormulaError';
}
