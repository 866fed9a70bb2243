// lather/catalogue: rankings of every arrangement and assignment, and the catalogue file format.

export * from '../errors.ts';
export { type RankOptions, rankAreas, checkAreas } from './rank.ts';
export { type RankPart, rankShard, mergeParts, readPart, writePart, shardTasks, PART_FORMAT, PART_VERSION } from './shard.ts';
export { type ArrangementFilter, passesFilter } from './filter.ts';
export { writeCatalogue, readCatalogue, CATALOGUE_SCHEMA_URL } from './format.ts';
export type { Catalogue, CatalogueEntry, CatalogueCounts, CatalogueQuery } from './types.ts';
export { CATALOGUE_FORMAT, CATALOGUE_VERSION } from './types.ts';
export { EXAMPLES, findExample } from './examples.ts';
export { areaClasses, orbitAssignments, orbitCount } from './assign.ts';
