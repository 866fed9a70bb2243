// lather library: re-exports only. Stages: maps -> arcs/solver -> catalogue -> render -> cli.

export * from './errors.ts';
export { CubicMap, next, prev, junctionOf, thetaMap, circleMap } from './maps/cubic-map.ts';
export { type CanonicalForm, canonicalForm, canonicalCluster } from './maps/canonical.ts';
export { encodeCode, decodeCode, mapFromCode } from './maps/code.ts';
export { validateCluster } from './maps/validate.ts';
export { type EnumeratedMap, type EnumerateOptions, enumerateMaps, isThreeConnected, shardLevel } from './maps/enumerate.ts';
export { type Cluster, clusterOf, clusterFromCode, enumerateClusters, cellPermutations } from './maps/cluster.ts';
export { type ClusterSummary, summarizeCluster } from './maps/describe.ts';
export { adjacencyGraph, graphmlGraph } from './maps/adjacency.ts';
export { type ArrangementCounts, countArrangements, rootedMapCount } from './maps/count.ts';
export { estimateClusterCount } from './maps/estimate.ts';
export { t1Swap } from './maps/t1.ts';
export { resolveArrangement, arrangementIds } from './maps/resolve.ts';
