/**
 * Coverage rasteriser for glyph outlines: closed contours of lines and quadratic or cubic Bézier
 * curves in pixel coordinates (x to the right, y down), filled by the non-zero winding rule
 * (the rule TrueType and CFF outlines are drawn with: OpenType spec, "glyf" table, and Adobe
 * Type 1 / CFF). Each pixel gets the fraction of its area inside the outline, 0 to 1: exact
 * across a row (spans are cut at their true x) and sampled on SUBSCANLINES rows per pixel
 * vertically.
 */

/** One outline command, as font libraries give them (opentype.js, fontkit): y down. */
export type OutlineCommand =
  | { readonly type: "M" | "L"; readonly x: number; readonly y: number }
  | { readonly type: "Q"; readonly x1: number; readonly y1: number; readonly x: number; readonly y: number }
  | { readonly type: "C"; readonly x1: number; readonly y1: number; readonly x2: number; readonly y2: number; readonly x: number; readonly y: number }
  | { readonly type: "Z" };

/** A coverage bitmap: `coverage[row * width + column]` in 0–1 for the pixel at (left + column, top + row). */
export interface CoverageBitmap {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
  readonly coverage: Float32Array;
}

/** Sample rows per pixel row: 16 gives coverage steps of 1/16 vertically. */
export const SUBSCANLINES = 16;

// Largest distance, in pixels, between a curve and the chords that stand in for it.
const FLATNESS_PX = 0.05;

interface Edge {
  readonly x0: number;
  readonly y0: number;
  readonly x1: number;
  readonly y1: number;
  /** +1 when the edge runs down (y0 < y1), −1 when up. */
  readonly winding: number;
}

// Chord count for a Bézier whose second differences have length `d`: the chord error of n equal
// parameter steps is at most |B''|max / (8 n²), and |B''|max is 2d (quadratic) or 6d (cubic).
function chordCount(secondDerivativeBound: number): number {
  return Math.max(1, Math.ceil(Math.sqrt(secondDerivativeBound / (8 * FLATNESS_PX))));
}

/** The outline as straight edges: curves cut into chords within FLATNESS_PX, horizontal edges dropped. */
function flatten(commands: readonly OutlineCommand[]): Edge[] {
  const edges: Edge[] = [];
  let startX = 0;
  let startY = 0;
  let x = 0;
  let y = 0;
  const lineTo = (nx: number, ny: number): void => {
    if (ny !== y) edges.push(ny > y ? { x0: x, y0: y, x1: nx, y1: ny, winding: 1 } : { x0: nx, y0: ny, x1: x, y1: y, winding: -1 });
    x = nx;
    y = ny;
  };
  for (const c of commands) {
    if (c.type === "M") {
      if (x !== startX || y !== startY) lineTo(startX, startY);
      startX = x = c.x;
      startY = y = c.y;
    } else if (c.type === "L") {
      lineTo(c.x, c.y);
    } else if (c.type === "Q") {
      const [x0, y0] = [x, y];
      const n = chordCount(2 * Math.hypot(x0 - 2 * c.x1 + c.x, y0 - 2 * c.y1 + c.y));
      for (let i = 1; i <= n; i++) {
        const t = i / n;
        const u = 1 - t;
        lineTo(u * u * x0 + 2 * u * t * c.x1 + t * t * c.x, u * u * y0 + 2 * u * t * c.y1 + t * t * c.y);
      }
    } else if (c.type === "C") {
      const [x0, y0] = [x, y];
      const d = Math.max(Math.hypot(x0 - 2 * c.x1 + c.x2, y0 - 2 * c.y1 + c.y2), Math.hypot(c.x1 - 2 * c.x2 + c.x, c.y1 - 2 * c.y2 + c.y));
      const n = chordCount(6 * d);
      for (let i = 1; i <= n; i++) {
        const t = i / n;
        const u = 1 - t;
        lineTo(
          u * u * u * x0 + 3 * u * u * t * c.x1 + 3 * u * t * t * c.x2 + t * t * t * c.x,
          u * u * u * y0 + 3 * u * u * t * c.y1 + 3 * u * t * t * c.y2 + t * t * t * c.y,
        );
      }
    } else {
      lineTo(startX, startY);
    }
  }
  if (x !== startX || y !== startY) lineTo(startX, startY);
  return edges;
}

// Adds `weight` × the length of [xa, xb) that falls in each cell of `row` (cell i is [i, i + 1)).
function addSpan(row: Float32Array, offset: number, width: number, xa: number, xb: number, weight: number): void {
  const a = Math.max(0, xa);
  const b = Math.min(width, xb);
  if (!(b > a)) return;
  const ia = Math.floor(a);
  const ib = Math.floor(b);
  if (ia === ib) {
    row[offset + ia]! += (b - a) * weight;
    return;
  }
  row[offset + ia]! += (ia + 1 - a) * weight;
  for (let i = ia + 1; i < ib; i++) row[offset + i]! += weight;
  if (ib < width) row[offset + ib]! += (b - ib) * weight;
}

// Edges as parallel arrays, sorted by their top y: x at the top, dx/dy, top and bottom y, winding.
interface EdgeTable {
  readonly count: number;
  readonly xTop: Float64Array;
  readonly slope: Float64Array;
  readonly yTop: Float64Array;
  readonly yBottom: Float64Array;
  readonly winding: Int8Array;
}

function edgeTable(edges: Edge[]): EdgeTable {
  edges.sort((p, q) => p.y0 - q.y0);
  const n = edges.length;
  const table = { count: n, xTop: new Float64Array(n), slope: new Float64Array(n), yTop: new Float64Array(n), yBottom: new Float64Array(n), winding: new Int8Array(n) };
  edges.forEach((e, i) => {
    table.xTop[i] = e.x0;
    table.slope[i] = (e.x1 - e.x0) / (e.y1 - e.y0);
    table.yTop[i] = e.y0;
    table.yBottom[i] = e.y1;
    table.winding[i] = e.winding;
  });
  return table;
}

// Adds one sample row at height yc to `coverage` row `row`: the crossings of the active edges,
// sorted by x, and the spans between them where the winding number is not zero.
function sampleRow(t: EdgeTable, active: Int32Array, activeCount: number, yc: number, xs: Float64Array, ws: Int8Array, coverage: Float32Array, offset: number, width: number, left: number): void {
  let n = 0;
  for (let a = 0; a < activeCount; a++) {
    const e = active[a]!;
    // Half-open in y, so that a vertex shared by two edges is counted once.
    if (yc < t.yTop[e]! || yc >= t.yBottom[e]!) continue;
    const x = t.xTop[e]! + (yc - t.yTop[e]!) * t.slope[e]! - left;
    const w = t.winding[e]!;
    // Insertion sort: a glyph row crosses a handful of edges.
    let k = n++;
    for (; k > 0 && xs[k - 1]! > x; k--) {
      xs[k] = xs[k - 1]!;
      ws[k] = ws[k - 1]!;
    }
    xs[k] = x;
    ws[k] = w;
  }
  let winding = 0;
  let spanStart = 0;
  for (let i = 0; i < n; i++) {
    const before = winding;
    winding += ws[i]!;
    // Non-zero rule: inside from where the winding leaves 0 to where it returns to 0.
    if (before === 0) spanStart = xs[i]!;
    else if (winding === 0) addSpan(coverage, offset, width, spanStart, xs[i]!, 1 / SUBSCANLINES);
  }
}

/**
 * The coverage of the outline `commands` (pixel units, y down): the bitmap spans the pixels the
 * outline's bounds touch. An outline with no area (a space) gives a 0 × 0 bitmap.
 */
export function rasteriseOutline(commands: readonly OutlineCommand[]): CoverageBitmap {
  const edges = flatten(commands);
  if (edges.length === 0) return { left: 0, top: 0, width: 0, height: 0, coverage: new Float32Array(0) };
  let minX = Infinity;
  let maxX = -Infinity;
  let minY = Infinity;
  let maxY = -Infinity;
  for (const e of edges) {
    minX = Math.min(minX, e.x0, e.x1);
    maxX = Math.max(maxX, e.x0, e.x1);
    minY = Math.min(minY, e.y0);
    maxY = Math.max(maxY, e.y1);
  }
  const left = Math.floor(minX);
  const top = Math.floor(minY);
  const width = Math.ceil(maxX) - left;
  const height = Math.ceil(maxY) - top;
  const coverage = new Float32Array(width * height);
  const table = edgeTable(edges);
  const active = new Int32Array(table.count);
  const xs = new Float64Array(table.count);
  const ws = new Int8Array(table.count);
  let activeCount = 0;
  let next = 0;
  for (let row = 0; row < height; row++) {
    for (let k = 0; k < SUBSCANLINES; k++) {
      const yc = top + row + (k + 0.5) / SUBSCANLINES;
      // Edges sorted by top: admit those that start above this sample row, drop those ended.
      while (next < table.count && table.yTop[next]! <= yc) active[activeCount++] = next++;
      let kept = 0;
      for (let a = 0; a < activeCount; a++) if (table.yBottom[active[a]!]! > yc) active[kept++] = active[a]!;
      activeCount = kept;
      sampleRow(table, active, activeCount, yc, xs, ws, coverage, row * width, width, left);
    }
  }
  for (let i = 0; i < coverage.length; i++) coverage[i] = Math.min(1, coverage[i]!);
  return { left, top, width, height, coverage };
}
