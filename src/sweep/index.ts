// lather/sweep: winners along paths and over regions of area space (formulas load mathjs when parsed).

export * from '../errors.ts';
export { type AreaFormula, parseAreaFormulas } from './formula.ts';
export { sweepPath } from './path.ts';
export { type SweepDomain, type PathDomain, type GridDomain, type TriangleDomain, parseVary, parseShares } from './domain.ts';
export { sweepRegion } from './region.ts';
export { pathSweepJson, regionSweepJson, SWEEP_FORMAT, SWEEP_VERSION } from './format.ts';
export type { SweepOptions, PathSweep, RegionSweep, Transition, Boundary, Interval } from './types.ts';
export { triangleSamples } from './triangle-grid.ts';
