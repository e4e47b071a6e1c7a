import type { LineStyle, Rgb, RgbaCanvas } from "./raster.js";

/**
 * Joins the points (xValues[k], yValues[k]) in order with lines in `style`, a lone point as a
 * dot; a NaN or infinite value in either array breaks the line. px and py give the pixel column
 * and row of an axis value.
 */
export function drawPolyline(
  canvas: RgbaCanvas,
  xValues: ArrayLike<number>,
  yValues: ArrayLike<number>,
  colour: Rgb,
  style: LineStyle,
  px: (x: number) => number,
  py: (y: number) => number,
): void {
  let prev: [number, number] | null = null;
  for (let k = 0; k < xValues.length; k++) {
    const x = xValues[k] ?? NaN;
    const y = yValues[k] ?? NaN;
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      prev = null;
      continue;
    }
    const point: [number, number] = [px(x), py(y)];
    if (prev === null) canvas.line(point[0], point[1], point[0], point[1], colour, style);
    else canvas.line(prev[0], prev[1], point[0], point[1], colour, style);
    prev = point;
  }
}
