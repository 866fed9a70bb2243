// lather/render: drawings as SVG text with exact arcs (pure functions).

export * from '../errors.ts';
export type { ClusterDrawing } from './types.ts';
export { renderClusterSvg, type ClusterSvgOptions } from './svg.ts';
export { renderContactSheet, type SheetItem, type ContactSheetOptions } from './sheet.ts';
export { renderPathPlot, renderRegionMap, type PathPlotOptions, type RegionMapOptions } from './plot.ts';
export { renderHistogram, type HistogramOptions } from './histogram.ts';
export { renderPanels } from './panels.ts';
