/**
 * Ideal constellations of the linear digital modulations (PSK and QAM), normalised to unit mean
 * energy: the reference points of symbol decisions and EVM (src/measure) and of synthetic links
 * (src/scenario).
 */

/** The constellations `constellation` knows. */
export type ConstellationKind = "bpsk" | "qpsk" | "8psk" | "16qam" | "32qam" | "64qam";

/** Every `ConstellationKind`, lowest order first. */
export const CONSTELLATION_KINDS: readonly ConstellationKind[] = ["bpsk", "qpsk", "8psk", "16qam", "32qam", "64qam"];

/** Number of points M of each kind. */
export const CONSTELLATION_ORDER: Readonly<Record<ConstellationKind, number>> = {
  bpsk: 2, qpsk: 4, "8psk": 8, "16qam": 16, "32qam": 32, "64qam": 64,
};

const cache = new Map<ConstellationKind, Float64Array>();

/**
 * The unnormalised QAM grid, interleaved I,Q: odd integers ±1, ±3, … on each axis.
 * Square M-QAM (M = 4, 16, 64) is the √M × √M grid, of mean energy 2(M − 1)/3 (Proakis,
 * Digital Communications, QAM signal sets). 32QAM is the cross constellation: the 6 × 6 grid
 * without its four corner points (±5, ±5), mean energy 20 (Proakis, ibid., cross constellations).
 * Exported for the tests of the geometry; callers want `constellation`.
 */
export function qamGrid(order: 4 | 16 | 32 | 64): Float64Array {
  const side = order === 32 ? 6 : Math.round(Math.sqrt(order));
  const pts: number[] = [];
  for (let a = 0; a < side; a++) {
    for (let b = 0; b < side; b++) {
      const i = 2 * a - side + 1;
      const q = 2 * b - side + 1;
      if (order === 32 && Math.abs(i) === 5 && Math.abs(q) === 5) continue;
      pts.push(i, q);
    }
  }
  return Float64Array.from(pts);
}

/**
 * The M ideal points of `kind`, interleaved I,Q, scaled to unit mean energy (1/M)·Σ|s|² = 1.
 * - bpsk: ±1. M-PSK (qpsk, 8psk): e^(jπ(2k+1)/M) for qpsk (points on the diagonals,
 *   (±1 ± j)/√2) and e^(j2πk/8) for 8psk (Proakis, PSK signal sets).
 * - 16qam, 64qam: the odd-integer grid divided by √(2(M − 1)/3) (Proakis); 32qam: the cross
 *   constellation divided by √20.
 * Returns a fresh copy; unknown kinds throw RangeError.
 */
export function constellation(kind: ConstellationKind): Float64Array {
  let base = cache.get(kind);
  if (base === undefined) {
    base = build(kind);
    cache.set(kind, base);
  }
  return base.slice();
}

function build(kind: ConstellationKind): Float64Array {
  switch (kind) {
    case "bpsk":
      return Float64Array.from([1, 0, -1, 0]);
    case "qpsk":
      return psk(4, Math.PI / 4);
    case "8psk":
      return psk(8, 0);
    case "16qam":
    case "32qam":
    case "64qam": {
      const grid = qamGrid(CONSTELLATION_ORDER[kind] as 16 | 32 | 64);
      let e = 0;
      for (let k = 0; k < grid.length; k++) e += (grid[k] as number) ** 2;
      const s = 1 / Math.sqrt(e / (grid.length / 2));
      return grid.map((v) => v * s);
    }
    default:
      throw new RangeError(`kind ${String(kind)} is not one of ${CONSTELLATION_KINDS.join(", ")}`);
  }
}

function psk(m: number, phase0: number): Float64Array {
  const out = new Float64Array(2 * m);
  for (let k = 0; k < m; k++) {
    const ph = phase0 + (2 * Math.PI * k) / m;
    out[2 * k] = Math.cos(ph);
    out[2 * k + 1] = Math.sin(ph);
  }
  return out;
}
