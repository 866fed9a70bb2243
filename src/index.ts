// lather library: re-exports only, every stage (maps -> arcs/solver -> catalogue -> sweep, atlas -> render).
// Each stage is also its own entry point (lather/maps, lather/solver, ...), so a program that needs
// only the enumerator loads only the enumerator.

export * from './maps/index.ts';
export * from './solver/index.ts';
export * from './catalogue/index.ts';
export * from './sweep/index.ts';
export * from './atlas/index.ts';
export * from './render/index.ts';
export { packageInfo } from './version.ts';
