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

// ② geometry and the relaxer
export { embedCluster } from './arcs/embed.ts';
export { relax, relaxFrom, type EquilibriumStart } from './solver/newton.ts';
export { type NewtonOptions, resolveOptions } from './solver/options.ts';
export type { Equilibrium, EquilibriumStatus } from './solver/result.ts';
export { type Certificate, checkEquilibrium, certificatePasses } from './solver/certificate.ts';

// ③ ranking and catalogues
export { type RankOptions, rankAreas, checkAreas } from './catalogue/rank.ts';
export { type ArrangementFilter, passesFilter } from './catalogue/filter.ts';
export { writeCatalogue, readCatalogue } from './catalogue/format.ts';
export type { Catalogue, CatalogueEntry, CatalogueCounts, CatalogueQuery } from './catalogue/types.ts';
export { CATALOGUE_FORMAT, CATALOGUE_VERSION } from './catalogue/types.ts';
export { EXAMPLES, findExample } from './catalogue/examples.ts';
export { areaClasses, orbitAssignments, orbitCount } from './catalogue/assign.ts';

// ③b sweeps of area space
export { type AreaFormula, parseAreaFormulas } from './sweep/formula.ts';
export { sweepPath } from './sweep/path.ts';
export { type SweepDomain, type PathDomain, type GridDomain, type TriangleDomain, parseVary, parseShares } from './sweep/domain.ts';
export { sweepRegion } from './sweep/region.ts';
export { pathSweepJson, regionSweepJson, SWEEP_FORMAT, SWEEP_VERSION } from './sweep/format.ts';
export type { SweepOptions, PathSweep, RegionSweep, Transition, Boundary, Interval } from './sweep/types.ts';
export { triangleSamples } from './sweep/triangle-grid.ts';

// ④ drawings
export type { ClusterDrawing } from './render/types.ts';
export { renderClusterSvg, type ClusterSvgOptions } from './render/svg.ts';
export { renderContactSheet, type SheetItem, type ContactSheetOptions } from './render/sheet.ts';
export { renderPathPlot, renderRegionMap, type PathPlotOptions, type RegionMapOptions } from './render/plot.ts';
