// render stage: the drawing protocol that cluster drawings are written against.

/**
 * A sink for path commands, so the same drawing code can write SVG path data (SvgPath) or drive
 * any other vector back end.
 *
 * Coordinates are in the drawing's own frame. `arcTo` follows the SVG 1.1 arc semantics ("Paths",
 * section 8.3.8, and "Elliptical arc implementation notes", appendix F.6, W3C SVG 1.1 Second
 * Edition, 2011) restricted to circles: an arc from the current point to (x, y) on a circle of
 * the given radius; `largeArc` selects the arc of more than 180 degrees; `sweep` selects the
 * direction of increasing angle (counter-clockwise when y points up, clockwise on a y-down screen).
 * Callers obtain the flags from `wallTo` in path.ts, never compute them themselves.
 */
export interface PathContext {
  /** Start a new subpath at (x, y). */
  moveTo(x: number, y: number): void;
  /** Straight segment from the current point to (x, y). */
  lineTo(x: number, y: number): void;
  /** Circular arc of `radius` from the current point to (x, y); see the interface notes for the flags. */
  arcTo(x: number, y: number, radius: number, largeArc: boolean, sweep: boolean): void;
  /** Close the current subpath back to its start. */
  closePath(): void;
}
