/**
 * Root-raised-cosine (RRC) FIR taps for any real number of samples per symbol.
 */

/**
 * The RRC impulse response at x = t/T (T the symbol period), roll-off α ∈ (0, 1], scaled so
 * that ∫ g(x)² dx = 1 over x (the unit-energy pulse of a symbol period 1):
 *
 *   g(x) = [sin(πx(1−α)) + 4αx·cos(πx(1+α))] / [πx(1 − (4αx)²)]
 *   g(0) = 1 − α + 4α/π
 *   g(±1/(4α)) = (α/√2)[(1 + 2/π)·sin(π/(4α)) + (1 − 2/π)·cos(π/(4α))]
 *
 * |G(f)|² is the raised-cosine spectrum (REFERENCES.md §7; Proakis, Digital Communications,
 * the square-root raised-cosine pulse; the closed form here recalled from memory and checked by
 * the tests against its defining property, g ⋆ g = raised cosine with zeros at x = k ≠ 0).
 */
export function rootRaisedCosine(x: number, rollOff: number): number {
  const a = rollOff;
  if (Math.abs(x) < 1e-9) return 1 - a + (4 * a) / Math.PI;
  if (Math.abs(Math.abs(x) - 1 / (4 * a)) < 1e-9) {
    const arg = Math.PI / (4 * a);
    return (a / Math.SQRT2) * ((1 + 2 / Math.PI) * Math.sin(arg) + (1 - 2 / Math.PI) * Math.cos(arg));
  }
  return (Math.sin(Math.PI * x * (1 - a)) + 4 * a * x * Math.cos(Math.PI * x * (1 + a))) /
    (Math.PI * x * (1 - (4 * a * x) ** 2));
}

/**
 * Unit-energy RRC FIR taps for `samplesPerSymbol` = fs/Rs (any real value > 1, e.g. 4.37):
 * h[n] = g((n − L)/sps, α) / √(Σ g²), n = 0 … 2L, L = ⌊spanSymbols·sps/2⌋, so Σ h[n]² = 1 and
 * the filter spans `spanSymbols` symbol periods in all (±spanSymbols/2 about the centre tap),
 * delay L samples, linear phase. Used as the matched filter of an RRC-shaped transmission, the
 * cascade is a raised cosine and the symbol-spaced samples are free of intersymbol interference
 * up to the truncation (Proakis, Nyquist criterion). Throws RangeError for sps ≤ 1, α outside
 * (0, 1] or a span under 2 symbols.
 */
export function rootRaisedCosineTaps(samplesPerSymbol: number, rollOff: number, spanSymbols: number): Float64Array {
  if (!(samplesPerSymbol > 1) || !Number.isFinite(samplesPerSymbol)) throw new RangeError(`samplesPerSymbol ${samplesPerSymbol} must be a finite number above 1`);
  if (!(rollOff > 0 && rollOff <= 1)) throw new RangeError(`rollOff ${rollOff} must lie in (0, 1]`);
  if (!(spanSymbols >= 2) || !Number.isFinite(spanSymbols)) throw new RangeError(`spanSymbols ${spanSymbols} must be a finite number of at least 2`);
  const half = Math.floor((spanSymbols * samplesPerSymbol) / 2);
  const taps = new Float64Array(2 * half + 1);
  let e = 0;
  for (let n = 0; n < taps.length; n++) {
    const v = rootRaisedCosine((n - half) / samplesPerSymbol, rollOff);
    taps[n] = v;
    e += v * v;
  }
  const s = 1 / Math.sqrt(e);
  for (let n = 0; n < taps.length; n++) taps[n] = (taps[n] as number) * s;
  return taps;
}
