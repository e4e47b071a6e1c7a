import { PNG } from "pngjs";
import type { RgbaCanvas } from "./raster.js";

/**
 * The canvas as a PNG file (ISO/IEC 15948), 8-bit truecolour without alpha since every pixel
 * is opaque, encoded by pngjs. Returns the bytes; writing them is the caller's business.
 */
export function encodePng(canvas: RgbaCanvas): Buffer {
  const png = new PNG({ width: canvas.width, height: canvas.height });
  png.data = Buffer.from(canvas.data.buffer, canvas.data.byteOffset, canvas.data.byteLength);
  return PNG.sync.write(png, { colorType: 2 });
}
