// lather/solver: the geometry of arcs and the relaxer (Newton's method on the equilibrium system).

export * from '../errors.ts';
export { embedCluster } from '../arcs/embed.ts';
export { relax, relaxFrom, type EquilibriumStart } from './newton.ts';
export {
  DEFAULT_STARTS, type EquilibriumSearch, type FoundEquilibrium, type LensRange, type SearchOptions, findEquilibria, searchAnswer,
} from './equilibria.ts';
export { type NewtonOptions, resolveOptions } from './options.ts';
export type { Equilibrium, EquilibriumStatus } from './result.ts';
export { type Certificate, checkEquilibrium, certificatePasses } from './certificate.ts';
