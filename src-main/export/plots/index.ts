// Public face of export/plots: SVG plot factories (d3 scales and shapes, our own SVG strings)
// and PNG rendering.
export { energyPlot, type EnergyPlotOptions } from './energy-plot.ts';
export { inputPlot, type InputPlotOptions } from './input-plot.ts';
export { phasePlot, type PhasePlotOptions } from './phase-plot.ts';
export { landscapePlot, type LandscapePlotOptions } from './landscape-plot.ts';
export { svgToPng } from './png.ts';
export { escapeXml } from './svg.ts';
export { COLORS, SERIES } from './colors.ts';
export { decimateIndices } from './decimate.ts';
