// lather/atlas: evidence maps over the whole simplex of cell areas (winner classes by area rank).

export * from '../errors.ts';
export { runAtlas, FOUR_CELL_CLAIM } from './atlas.ts';
export { atlasSamples, reachableRatio, DEFAULT_MIN_SHARE, ATLAS_MIN_CELLS, ATLAS_MAX_CELLS, ATLAS_MAX_SAMPLES } from './design.ts';
export { atlasJson, readAtlas, ATLAS_FORMAT, ATLAS_VERSION, ATLAS_SCHEMA_URL } from './format.ts';
export type { Atlas, AtlasOptions, AtlasSample, AtlasPlacement, AtlasClass, AtlasBoundary, ClaimSummary } from './types.ts';
