/**
 * The plot area of an x/y figure (line figure, histogram): the y axis on the left, the x axis
 * below, room at the right for the last x label to stick out by half its width, the frame, ticks,
 * grid and axis titles drawn, and the mappings from axis values to pixels.
 */
import { buildAxis, drawAxes, positionPx, xAxisDepthPx, yAxisDepthPx, type AxisQuantity } from "./axes.js";
import { PAGE_STYLE, pagePaddingPx } from "./figureFrame.js";
import { textWidthPx } from "./font.js";
import type { Rect, RgbaCanvas } from "./raster.js";

export interface PlotAreaInput {
  readonly x: { readonly name: string; readonly quantity: AxisQuantity; readonly min: number; readonly max: number };
  readonly y: { readonly name: string; readonly quantity: AxisQuantity; readonly min: number; readonly max: number };
  /** Top edge of the plot, px (below the title block and any legend). */
  readonly plotTop: number;
  readonly textScale: number;
  /** Names the figure in the error for too small an image. */
  readonly figure: string;
}

export interface PlotArea {
  readonly plot: Rect;
  /** Continuous image coordinates of axis values. */
  xOf(x: number): number;
  yOf(y: number): number;
  /** The pixel under an axis value (the last pixel for the far edge itself). */
  px(x: number): number;
  py(y: number): number;
}

export function drawPlotArea(canvas: RgbaCanvas, input: PlotAreaInput): PlotArea {
  const s = input.textScale;
  const { width: widthPx, height: heightPx } = canvas;
  const pad = pagePaddingPx(s);
  const plotTop = input.plotTop;
  const plotHeight = heightPx - pad - xAxisDepthPx(s) - plotTop;
  const yAxis = buildAxis({ min: input.y.min, max: input.y.max, quantity: input.y.quantity, name: input.y.name, lengthPx: plotHeight, orientation: "vertical", textScale: s });
  const plotLeft = pad + yAxisDepthPx(yAxis, s);
  const xRequest = { min: input.x.min, max: input.x.max, quantity: input.x.quantity, name: input.x.name, orientation: "horizontal", textScale: s } as const;
  // The last x label may stick out past the plot by half its width: leave room for it.
  const draft = buildAxis({ ...xRequest, lengthPx: widthPx - plotLeft - pad });
  const lastLabel = draft.ticks[draft.ticks.length - 1]?.label ?? "";
  const plotWidth = widthPx - plotLeft - pad - Math.ceil(textWidthPx(lastLabel, s) / 2);
  if (plotWidth < 64 || plotHeight < 64) throw new RangeError(`${input.figure}: ${widthPx} × ${heightPx} px leaves no room for the plot`);
  const xAxis = buildAxis({ ...xRequest, lengthPx: plotWidth });
  const plot: Rect = { x: plotLeft, y: plotTop, width: plotWidth, height: plotHeight };
  drawAxes(canvas, plot, xAxis, yAxis, {
    textScale: s,
    frameColour: PAGE_STYLE.frameColour,
    textColour: PAGE_STYLE.inkColour,
    gridColour: PAGE_STYLE.gridColour,
    yMinAtTop: false,
  });
  const xOf = (x: number): number => positionPx(x, xAxis, plot.x, plot.width, false);
  const yOf = (y: number): number => positionPx(y, yAxis, plot.y, plot.height, true);
  return {
    plot,
    xOf,
    yOf,
    px: (x) => Math.min(plot.x + plot.width - 1, Math.floor(xOf(x))),
    py: (y) => Math.min(plot.y + plot.height - 1, Math.floor(yOf(y))),
  };
}
