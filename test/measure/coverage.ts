/**
 * Shared by the coverage tests: how often a stated k = 2 uncertainty covers the true error, and
 * how wide it is against the error. For a Gaussian error a k = 2 interval covers 95.4 %; the
 * tests ask ≥ 90 % of ≥ 50 seeds (binomial spread at n = 50: ±3 % at 1σ), and a median width
 * below 5× the median |error| (for a Gaussian error with an exact σ the ratio is 2/0.674 ≈ 3):
 * an interval that is honest but not inflated.
 */
export interface Coverage {
  readonly covered: number;
  readonly ratio: number;
}

export function coverage(errors: readonly number[], widths: readonly number[]): Coverage {
  let hit = 0;
  for (let i = 0; i < errors.length; i++) if (Math.abs(errors[i] as number) <= (widths[i] as number)) hit++;
  const med = (x: number[]): number => {
    const s = [...x].sort((a, b) => a - b);
    return s[s.length >> 1] as number;
  };
  return { covered: hit / errors.length, ratio: med([...widths]) / med(errors.map(Math.abs)) };
}
