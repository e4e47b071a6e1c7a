// The public surface of src/render: re-exports only.
export { fontMetricsPx, hasGlyph, textWidthPx, textHeightPx, capMiddlePx, forEachInkPixel, type FontMetricsPx } from "./font.js";
export { rasteriseOutline, SUBSCANLINES, type CoverageBitmap, type OutlineCommand } from "./outlineRaster.js";
export { RgbaCanvas, measureText, type Rgb, type Rect, type LineStyle, type TextStyle } from "./raster.js";
export {
  srgbEncode,
  srgbDecode,
  linearSrgbToOklab,
  oklabToLinearSrgb,
  xyzD65ToOklab,
  srgb8ToOklab,
  rampColour,
  rampIndex,
  COLOUR_RAMP_SIZE,
  COLOUR_RAMP_OKLAB,
  COLOUR_RAMP_RGB,
  labFromLch,
  rampHueRad,
  maxChromaInGamut,
  oklabToSrgb8,
  type Oklab,
  type LinearRgb,
} from "./colourRamp.js";
export {
  niceNumber,
  niceTicks,
  ticksWithStep,
  nextNiceStep,
  siScaleForHz,
  siScaleForSeconds,
  fractionDigitsForStep,
  formatTickLabel,
  formatHz,
  formatSeconds,
  type Ticks,
  type SiScale,
} from "./ticks.js";
export { daysFromCivil, civilFromDays, type CivilDate } from "./civilDate.js";
export {
  CALENDAR_STEPS,
  calendarStepSeconds,
  calendarTickValues,
  formatCalendarLabel,
  type CalendarStep,
  type CalendarUnit,
} from "./calendarTicks.js";
export {
  buildAxis,
  positionPx,
  drawAxes,
  tickLengthPx,
  axisGapPx,
  xAxisDepthPx,
  yAxisDepthPx,
  type Axis,
  type AxisTick,
  type AxisQuantity,
  type AxisRequest,
  type AxesStyle,
} from "./axes.js";
export { drawColourBar, colourBarWidthPx, colourBarLabelDepthPx, type ColourBarStyle } from "./colourBar.js";
export { PAGE_STYLE, MIN_FIGURE_SIZE, checkFigureSize, textScaleFor, pagePaddingPx, fitText, drawTitleBlock } from "./figureFrame.js";
export { wrapText } from "./wrapText.js";
export { encodePng } from "./encodePng.js";
export {
  autoDbRange,
  AUTO_DB_RANGE_STEP_DB,
  AUTO_DB_RANGE_FLOOR_MARGIN_DB,
  AUTO_DB_RANGE_MIN_SPAN_DB,
  AUTO_DB_RANGE_FLOOR_PERCENTILE,
} from "./autoDbRange.js";
export { renderSpectrogram, spectrogramPlotRows, type SpectrogramFigureInput, type SpectrogramRegion, type FigureLayout } from "./spectrogramFigure.js";
export {
  renderLineFigure,
  SERIES_COLOURS,
  MARKER_COLOUR,
  type LineFigureInput,
  type LineFigureAxisInput,
  type LineSeries,
  type MarkerLine,
  type ShadedSpan,
  type PointNote,
} from "./lineFigure.js";
export { pointMarkerHalfPx, type PointSeries } from "./pointSeries.js";
export { drawMarkerLines } from "./markerLines.js";
export { SERIES_PALETTE_OKLAB, SERIES_PALETTE_RGB } from "./seriesPalette.js";
export {
  renderConstellation,
  CONSTELLATION_GRID_CELLS,
  IDEAL_POINT_COLOUR,
  type ConstellationFigureInput,
} from "./constellationFigure.js";
export { renderHistogram, type HistogramFigureInput } from "./histogramFigure.js";
