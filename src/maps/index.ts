// lather/maps: the combinatorics of arrangements (integers only; loads no heavy dependency).

export * from '../errors.ts';
export { CubicMap, next, prev, junctionOf, thetaMap, circleMap } from './cubic-map.ts';
export { type CanonicalForm, canonicalForm, canonicalCluster } from './canonical.ts';
export { CODE_CELL_LIMIT, encodeCode, decodeCode, mapFromCode } from './code.ts';
export { validateCluster } from './validate.ts';
export { type EnumeratedMap, type EnumerateOptions, enumerateMaps, isThreeConnected, SHARD_LIMIT, shardLevel } from './enumerate.ts';
export { type Cluster, clusterOf, clusterFromCode, enumerateClusters, cellPermutations } from './cluster.ts';
export { type ClusterSummary, summarizeCluster } from './describe.ts';
export { adjacencyGraph, graphmlGraph } from './adjacency.ts';
export { type ArrangementCounts, countArrangements, rootedMapCount } from './count.ts';
export { COUNT_IN_WORDS_ABOVE, DURATION_IN_WORDS_ABOVE, countText, durationText, estimateClusterCount } from './estimate.ts';
export { t1Swap, lowerDartOfWall, wallSwapCode } from './t1.ts';
export { ARRANGEMENT_COUNTS, ID_LIMIT, resolveArrangement, arrangementIds } from './resolve.ts';
