// The Plotline demo scenario: everything public, re-exported in one place.
export { generatePlotline, type PlotlineChunk } from "./generate-plotline.js";
export { writePlotline } from "./write-plotline.js";
export {
  resolvePlotlineOptions,
  type PlotlineOptions,
  type ResolvedPlotlineOptions,
} from "./plotline-options.js";
export {
  plotlineColumns,
  PLOTLINE_COLUMN_NAMES,
  type PlotlineChunkColumns,
} from "./plotline-columns.js";
export {
  PLOTLINE_OUTCOMES,
  POST_TYPES,
  GARDEN_SITES,
  DEVICES,
  type PlotlineOutcome,
} from "./plotline-vocabulary.js";
