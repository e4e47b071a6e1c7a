/**
 * Random symbol sequences drawn from the ideal PSK/QAM constellations (src/dsp/constellations.ts,
 * re-exported here for the synthetic links).
 */
import { constellation, type ConstellationKind } from "../dsp/index.js";
import { requireCount } from "./checks.js";
import type { SeededRandom } from "./random.js";

export {
  constellation, qamGrid, CONSTELLATION_KINDS, CONSTELLATION_ORDER, type ConstellationKind,
} from "../dsp/index.js";

/**
 * `count` independent, equally likely symbols of `kind` (unit mean energy), interleaved I,Q,
 * drawn with `rng`. No bit mapping: the index of each point is uniform on [0, M).
 */
export function randomSymbols(rng: SeededRandom, kind: ConstellationKind, count: number): Float64Array {
  requireCount("count", count);
  const pts = constellation(kind);
  const m = pts.length >> 1;
  const out = new Float64Array(2 * count);
  for (let k = 0; k < count; k++) {
    const v = rng.integer(m);
    out[2 * k] = pts[2 * v] as number;
    out[2 * k + 1] = pts[2 * v + 1] as number;
  }
  return out;
}
