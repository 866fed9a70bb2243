// render stage: the project's colours: light cell fills, dark series lines, and marker shapes.
//
// How the colours were chosen (this project's own design): candidates on a grid of the OKLab
// lightness/chroma/hue cylinder inside the sRGB gamut; a greedy farthest-point choice, then local
// swaps, maximising the smallest colour difference between any two colours as seen with normal
// vision and with simulated protanopia, deuteranopia and tritanopia (the severity-1 matrices of
// "A physiologically-based model for simulation of color vision deficiency", IEEE Trans.
// Visualization and Computer Graphics 15, 2009). Fills: lightness 0.74..0.92 and chroma <= 0.11
// so dark walls and black labels read on every cell. Lines: lightness 0.38..0.60 and chroma <= 0.15
// so they read on white and on their own band tints. Colour is never the only cue: series also
// differ by marker shape, and cells carry their number.

/** Cell fills, cell i (1-based) takes CELL_FILLS[(i - 1) % 8]. */
export const CELL_FILLS: readonly string[] = [
  '#8cb2f1', // blue
  '#e1957a', // terracotta
  '#e3bf76', // ochre
  '#b1f5e6', // mint
  '#b7cabb', // sage grey
  '#c09fb7', // mauve
  '#f8e597', // pale yellow
  '#7dd9fb', // sky
];

/** Series line colours, series i (0-based) takes SERIES_LINES[i % 8]. */
export const SERIES_LINES: readonly string[] = [
  '#3b4097', // indigo
  '#bd6614', // orange
  '#781d00', // dark rust
  '#4c7fd3', // mid blue
  '#665c82', // slate violet
  '#563455', // plum
  '#927979', // taupe
  '#924d35', // brown
];

/** Marker shapes for series, in the same rotation as SERIES_LINES. */
export const MARKER_SHAPES = ['circle', 'square', 'triangle', 'diamond', 'triangle-down', 'cross', 'plus', 'star'] as const;

/** A marker shape name. */
export type MarkerShape = (typeof MARKER_SHAPES)[number];

/** Ink for walls, axes and text. */
export const INK = '#222222';
/** Fill for a place with no certified winner (region maps). */
export const NO_WINNER_FILL = '#e4e4e4';
/** Frame of a saddle's tile on a contact sheet (an unstable equilibrium: the orange of SERIES_LINES). */
export const SADDLE_FRAME = '#bd6614';

/** The fill of cell i (1-based), cycling through `palette`. */
export function cellFill(i: number, palette: readonly string[] = CELL_FILLS): string {
  return palette[(i - 1) % palette.length];
}

/** The line colour of series i (0-based). */
export function seriesLine(i: number): string {
  return SERIES_LINES[i % SERIES_LINES.length];
}

/** The marker shape of series i (0-based). */
export function seriesMarker(i: number): MarkerShape {
  return MARKER_SHAPES[i % MARKER_SHAPES.length];
}

/**
 * A light tint of a #rrggbb colour for shaded bands: `share` of the colour over white, mixed in
 * sRGB values and rounded to whole channel values.
 */
export function tint(colour: string, share = 0.22): string {
  const v = Number.parseInt(colour.slice(1), 16);
  const mix = (channel: number): string =>
    Math.round(255 + share * (channel - 255))
      .toString(16)
      .padStart(2, '0');
  return `#${mix((v >> 16) & 255)}${mix((v >> 8) & 255)}${mix(v & 255)}`;
}

/**
 * SVG for a marker of `shape` centred at (x, y) with half-size r, in the caller's units,
 * filled with `colour` (open shapes 'cross' and 'plus' are stroked).
 */
export function markerSvg(shape: MarkerShape, x: number, y: number, r: number, colour: string, n: (v: number) => string): string {
  const p = (pairs: number[][]): string => pairs.map(([dx, dy]) => `${n(x + dx * r)},${n(y + dy * r)}`).join(' ');
  switch (shape) {
    case 'circle':
      return `<circle cx="${n(x)}" cy="${n(y)}" r="${n(r)}" fill="${colour}"/>`;
    case 'square':
      return `<rect x="${n(x - 0.85 * r)}" y="${n(y - 0.85 * r)}" width="${n(1.7 * r)}" height="${n(1.7 * r)}" fill="${colour}"/>`;
    case 'triangle':
      return `<polygon points="${p([[0, -1.15], [1, 0.6], [-1, 0.6]])}" fill="${colour}"/>`;
    case 'triangle-down':
      return `<polygon points="${p([[0, 1.15], [1, -0.6], [-1, -0.6]])}" fill="${colour}"/>`;
    case 'diamond':
      return `<polygon points="${p([[0, -1.2], [1.2, 0], [0, 1.2], [-1.2, 0]])}" fill="${colour}"/>`;
    case 'cross':
      return `<path d="M${n(x - r)} ${n(y - r)} L${n(x + r)} ${n(y + r)} M${n(x - r)} ${n(y + r)} L${n(x + r)} ${n(y - r)}" stroke="${colour}" stroke-width="1.6" fill="none"/>`;
    case 'plus':
      return `<path d="M${n(x - 1.15 * r)} ${n(y)} L${n(x + 1.15 * r)} ${n(y)} M${n(x)} ${n(y - 1.15 * r)} L${n(x)} ${n(y + 1.15 * r)}" stroke="${colour}" stroke-width="1.6" fill="none"/>`;
    case 'star': {
      const pts: number[][] = [];
      for (let k = 0; k < 10; k++) {
        const a = -Math.PI / 2 + (k * Math.PI) / 5;
        const s = k % 2 === 0 ? 1.3 : 0.55;
        pts.push([s * Math.cos(a), s * Math.sin(a)]);
      }
      return `<polygon points="${p(pts)}" fill="${colour}"/>`;
    }
  }
}
